import { describe, it, expect, beforeAll } from 'vitest';
import fs from 'node:fs';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { surveys } from '@server/db/schema/surveys';
import { sites } from '@server/db/schema/sites';
import { users } from '@server/db/schema/organizations';
import { findUnsafeCharacter, multiLineText, singleLineText } from '@shared/schemas/text';
import { z } from 'zod';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

const count = (table: typeof sites | typeof surveys | typeof users) => t.db.select().from(table).all().length;

describe('the shared text rule (shared/schemas/text.ts)', () => {
  // The bidi controls of "Trojan Source" (CVE-2021-42574) and Unicode UAX #9: LRE, RLE, PDF, LRO, RLO, LRI, RLI, FSI, PDI.
  const BIDI = ['\u202a', '\u202b', '\u202c', '\u202d', '\u202e', '\u2066', '\u2067', '\u2068', '\u2069'];

  it('refuses every C0 control, DEL, C1 controls and each bidi embedding, override or isolate on one line', () => {
    for (let c = 0; c <= 0x1f; c++) expect(findUnsafeCharacter(`a${String.fromCharCode(c)}b`), `U+${c.toString(16)}`).toMatchObject({ index: 1 });
    expect(findUnsafeCharacter('a\u007fb')).not.toBeNull();
    expect(findUnsafeCharacter('a\u0085b')).not.toBeNull();
    for (const ch of BIDI) expect(findUnsafeCharacter(`x${ch}y`)?.description).toMatch(/bidirectional/);
  });

  it('allows tab and line breaks only where text may span lines, and ordinary text everywhere', () => {
    expect(findUnsafeCharacter('Line one\nline two\r\n\tindented', true)).toBeNull();
    expect(findUnsafeCharacter('a\tb')?.description).toMatch(/tab/);
    expect(findUnsafeCharacter('a\nb')?.description).toMatch(/line break/);
    expect(findUnsafeCharacter('a\u0000b', true)).not.toBeNull();
    expect(findUnsafeCharacter('\u202eb', true)).not.toBeNull();
    // Right-to-left scripts, marks (LRM U+200E), accents and emoji are text, not controls.
    expect(findUnsafeCharacter('מחסן ראשי \u200e Sala 3 · Zürich · 東棟 · 💡')).toBeNull();
  });

  it('keeps the wrapped schema\'s own trimming, lengths and messages', () => {
    const name = singleLineText(z.string().trim().min(1, 'Enter a name').max(5));
    expect(name.parse('  abc  ')).toBe('abc');
    expect(name.safeParse('').error?.issues[0].message).toBe('Enter a name');
    expect(name.safeParse('abcdef').success).toBe(false);
    expect(multiLineText(z.string()).safeParse('a\nb').success).toBe(true);
  });

  it('is used by every typed text field of the request schemas', () => {
    // Every trimmed string in shared/schemas is wrapped in singleLineText/multiLineText, unless a
    // pattern already limits it to safe characters (.regex) or it is an e-mail address or time zone.
    const dir = 'shared/schemas';
    const unwrapped: string[] = [];
    for (const file of fs.readdirSync(dir)) {
      const src = fs.readFileSync(`${dir}/${file}`, 'utf8');
      for (const [i, line] of src.split('\n').entries()) {
        for (const m of line.matchAll(/z\.string\(\)\.trim\(\)/g)) {
          const before = line.slice(0, m.index);
          const after = line.slice(m.index);
          const wrapped = /(singleLineText|multiLineText)\($/.test(before);
          const patterned = /^z\.string\(\)\.trim\(\)[^;]*\.regex\(/.test(after) || /\.regex\(/.test(src.split('\n')[i + 1] ?? '');
          const exempt = /emailSchema|timeZoneSchema/.test(before);
          if (!wrapped && !patterned && !exempt) unwrapped.push(`${file}:${i + 1}: ${line.trim()}`);
        }
      }
    }
    expect(unwrapped).toEqual([]);
  });
});

describe('text fields over the API: 400 naming the field, nothing stored', () => {
  it('a site name with a right-to-left override, when posted, answers 400 naming "name" and no site is made', async () => {
    const admin = await t.signIn(DEMO.admin);
    const before = count(sites);
    const res = await admin.post('/api/sites').send({ name: '\u202eRTL override gnp.exe', timeZone: 'Europe/London' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/field "name".*bidirectional override \(U\+202E\)/);
    expect(count(sites)).toBe(before);
  });

  it('a site name with NUL, when posted, answers 400; an address over several lines is accepted', async () => {
    const admin = await t.signIn(DEMO.admin);
    const before = count(sites);
    const nul = await admin.post('/api/sites').send({ name: 'Depot\u0000', timeZone: 'Europe/London' });
    expect(nul.status).toBe(400);
    expect(nul.body.error.message).toMatch(/field "name".*control character \(U\+0000\)/);
    expect(count(sites)).toBe(before);
    const ok = await admin.post('/api/sites').send({ name: 'Kiln Lane depot', address: '3 Kiln Lane\nHarrowgate', timeZone: 'Europe/London' });
    expect(ok.status).toBe(201);
  });

  it('a survey name with a line break, when posted, answers 400 naming "name" and no survey is made', async () => {
    const admin = await t.signIn(DEMO.admin);
    const siteId = t.db.select().from(sites).all()[0].id;
    const before = count(surveys);
    const res = await admin.post('/api/surveys').send({ siteId, name: 'Spring\nwalk' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/field "name".*line break/);
    expect(count(surveys)).toBe(before);
  });

  it('an invitation whose name holds an isolate, when posted, answers 400 and invites nobody', async () => {
    const admin = await t.signIn(DEMO.admin);
    const before = count(users);
    const res = await admin.post('/api/invitations').send({ email: 'iso@luxtrail.test', name: 'Ana \u2067Gray', role: 'surveyor' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/field "name"/);
    expect(count(users)).toBe(before);
  });

  it('a return comment with a bidi override, when posted, answers 400 naming "comment"', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const submitted = t.db.select().from(surveys).all().find((s) => s.status === 'submitted')!;
    const res = await fm.post(`/api/surveys/${submitted.id}/return`).send({ comment: 'Please \u202dcheck' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/field "comment"/);
    expect(t.db.select().from(surveys).all().find((s) => s.id === submitted.id)!.status).toBe('submitted');
  });
});
