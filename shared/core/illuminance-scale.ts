/**
 * EN 12464-1 illuminance scale and the 2021 edition's required and modified values.
 * The scale (EN 12464-1:2011 4.3.1 and 2021, secondary sources, DOMAIN.md section 5): successive
 * steps differ by a factor of about 1.5, the smallest difference a person notices.
 */
export const ILLUMINANCE_SCALE_LUX = [20, 30, 50, 75, 100, 150, 200, 300, 500, 750, 1000, 1500, 2000, 3000, 5000] as const;

/** Index of an exact step of the scale, or -1. */
export function scaleIndex(lux: number): number {
  return ILLUMINANCE_SCALE_LUX.findIndex((s) => s === lux);
}

export function isOnScale(lux: number): boolean {
  return scaleIndex(lux) >= 0;
}

/** The value `steps` steps along the scale from `lux` (a step of the scale); null past either end or off the scale. */
export function stepAlongScale(lux: number, steps: number): number | null {
  const i = scaleIndex(lux);
  if (i < 0 || !Number.isInteger(steps)) return null;
  return ILLUMINANCE_SCALE_LUX[i + steps] ?? null;
}

/** Signed number of steps from `from` to `to`, both on the scale; null otherwise. */
export function stepsBetween(from: number, to: number): number | null {
  const a = scaleIndex(from);
  const b = scaleIndex(to);
  return a < 0 || b < 0 ? null : b - a;
}

export type ModifierDirection = 'raise' | 'lower';

export type ContextModifier = { id: string; direction: ModifierDirection; text: string };

/**
 * Context modifiers of EN 12464-1:2021 (5.3.3), written from memory of the text and secondary summaries:
 * the standard's wording was not at hand, so the list is marked `memory` wherever it is shown.
 * Each applicable modifier moves the value by (typically) one step of the scale.
 */
export const CONTEXT_MODIFIERS: readonly ContextModifier[] = [
  { id: 'critical_work', direction: 'raise', text: 'Visual work is critical' },
  { id: 'costly_errors', direction: 'raise', text: 'Errors are costly to correct' },
  { id: 'accuracy_productivity', direction: 'raise', text: 'Accuracy, higher productivity or concentration is of great importance' },
  { id: 'small_low_contrast', direction: 'raise', text: 'Task details are unusually small or of low contrast' },
  { id: 'long_duration', direction: 'raise', text: 'The task is done for an unusually long time' },
  { id: 'low_visual_capacity', direction: 'raise', text: 'The people doing it see less well than usual (for example older workers)' },
  { id: 'low_daylight', direction: 'raise', text: 'The task area has little daylight' },
  { id: 'large_high_contrast', direction: 'lower', text: 'Task details are unusually large or of high contrast' },
  { id: 'short_duration', direction: 'lower', text: 'The task is done for an unusually short time' },
];
export const CONTEXT_MODIFIERS_SOURCE = 'EN 12464-1:2021, 5.3.3 context modifiers (list written from memory, unchecked against the text)';

export const CONTEXT_MODIFIER_IDS = CONTEXT_MODIFIERS.map((m) => m.id) as [string, ...string[]];

export type DesignValueInput = {
  requiredLux: number;
  /** The entry's modified value (the most the context modifiers lead to); null when the entry gives none. */
  modifiedLux: number | null;
  /** The value the design chose; null: the required value. */
  chosenLux: number | null;
  modifiers: readonly string[];
};

export type DesignValue = {
  /** The maintained illuminance the zone is judged against. */
  emLux: number;
  basis: 'required' | 'modified' | 'stepped';
  /** Steps along the scale from the required value. */
  steps: number;
  /** One sentence for the verdict: which value and why. */
  explanation: string;
  /** Problems that made the chosen value unusable (then the required value is used). */
  problems: string[];
};

/**
 * The value a zone is judged against (our rule, from EN 12464-1:2021 5.3.3 as summarised above):
 * the required value, or a value the design chose along the scale. Raising it needs at least one
 * raising modifier and cannot pass the entry's modified value; lowering needs a lowering modifier and
 * goes at most one step (memory). A chosen value that breaks these rules is refused and the
 * required value is used, with the reason.
 */
export function designValue(input: DesignValueInput): DesignValue {
  const { requiredLux, modifiedLux, chosenLux, modifiers } = input;
  const known = modifiers.map((id) => CONTEXT_MODIFIERS.find((m) => m.id === id)).filter((m): m is ContextModifier => m !== undefined);
  const raises = known.filter((m) => m.direction === 'raise');
  const lowers = known.filter((m) => m.direction === 'lower');
  const problems = designValueProblems(input);
  const fmt = (v: number) => `${Number(v.toPrecision(6))} lx`;
  if (chosenLux === null || chosenLux === requiredLux || problems.length > 0) {
    return {
      emLux: requiredLux, basis: 'required', steps: 0, problems,
      explanation: problems.length > 0
        ? `Judged against the required value ${fmt(requiredLux)}: the chosen ${chosenLux === null ? '' : fmt(chosenLux)} cannot be used (${problems.join(' ')})`
        : `Judged against the required value ${fmt(requiredLux)}${known.length ? ` (modifiers noted, no change of value: ${known.map((m) => m.text.toLowerCase()).join('; ')})` : ''}.`,
    };
  }
  const steps = stepsBetween(requiredLux, chosenLux) as number;
  const why = (steps > 0 ? raises : lowers).map((m) => m.text.toLowerCase()).join('; ');
  const basis = modifiedLux !== null && chosenLux === modifiedLux ? 'modified' : 'stepped';
  return {
    emLux: chosenLux, basis, steps, problems: [],
    explanation: `Judged against ${basis === 'modified' ? 'the modified value' : 'a value chosen by the design'} ${fmt(chosenLux)}, ${Math.abs(steps)} step(s) ${steps > 0 ? 'above' : 'below'} the required ${fmt(requiredLux)}, because: ${why}.`,
  };
}

/** Why a chosen value cannot stand for the entry; empty when it can (or when none was chosen). */
export function designValueProblems(input: DesignValueInput): string[] {
  const { requiredLux, modifiedLux, chosenLux, modifiers } = input;
  if (chosenLux === null || chosenLux === requiredLux) return [];
  const out: string[] = [];
  const unknown = modifiers.filter((id) => !CONTEXT_MODIFIERS.some((m) => m.id === id));
  if (unknown.length) out.push(`Unknown context modifier(s): ${unknown.join(', ')}.`);
  const steps = stepsBetween(requiredLux, chosenLux);
  if (steps === null) {
    out.push(`${chosenLux} lx and the required ${requiredLux} lx must both be steps of the illuminance scale (${ILLUMINANCE_SCALE_LUX.join(', ')} lx).`);
    return out;
  }
  const dir = (d: ModifierDirection) => modifiers.some((id) => CONTEXT_MODIFIERS.find((m) => m.id === id)?.direction === d);
  if (steps > 0) {
    if (modifiedLux !== null && chosenLux > modifiedLux) out.push(`It is above the entry's modified value ${modifiedLux} lx.`);
    if (!dir('raise')) out.push('Raising the value needs at least one raising context modifier.');
  } else {
    if (steps < -1) out.push('Lowering goes at most one step below the required value.');
    if (!dir('lower')) out.push('Lowering the value needs at least one lowering context modifier.');
  }
  return out;
}
