import { z } from 'zod';

/**
 * Characters no typed name or text may hold: C0 controls (U+0000-U+001F), DEL and the C1
 * controls (U+007F-U+009F), invisible and able to break exports, mail and logs; and the
 * bidirectional embeddings, overrides and isolates (U+202A-U+202E, U+2066-U+2069), which make
 * text display in an order other than it is stored ("Trojan Source", CVE-2021-42574; Unicode
 * UAX #9). Multi-line fields also allow tab, line feed and carriage return.
 */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const FORBIDDEN_SINGLE = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/u;
// eslint-disable-next-line no-control-regex -- as above
const FORBIDDEN_MULTI = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/u;

function describe(ch: string, multiline: boolean): string {
  const code = `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
  if (/[\u202a-\u202e\u2066-\u2069]/u.test(ch)) return `a bidirectional override (${code}), which can make text show in another order than it is stored`;
  if (!multiline && /[\t\n\r]/.test(ch)) return `a ${ch === '\t' ? 'tab' : 'line break'} (${code}); this field is one line`;
  return `a control character (${code})`;
}

/** The first forbidden character of a text and where it is (0-based), or null. */
export function findUnsafeCharacter(value: string, multiline = false): { index: number; description: string } | null {
  const m = (multiline ? FORBIDDEN_MULTI : FORBIDDEN_SINGLE).exec(value);
  return m ? { index: m.index, description: describe(m[0], multiline) } : null;
}

function refuseUnsafe(multiline: boolean) {
  return (value: string, ctx: z.RefinementCtx) => {
    const bad = findUnsafeCharacter(value, multiline);
    if (bad) ctx.addIssue({ code: 'custom', message: `contains ${bad.description} at character ${bad.index + 1}: use plain text` });
  };
}

/**
 * Every one-line name or text a person types (site, survey, plan, zone, target and user names,
 * certificate numbers, sources) goes through this: the given string schema (trim, lengths,
 * messages) plus the refusal of control and bidi-override characters.
 */
export function singleLineText<S extends z.ZodString>(schema: S): S {
  return schema.superRefine(refuseUnsafe(false)) as S;
}

/** As singleLineText, for notes, comments, messages, descriptions and addresses: tab and line breaks allowed. */
export function multiLineText<S extends z.ZodString>(schema: S): S {
  return schema.superRefine(refuseUnsafe(true)) as S;
}
