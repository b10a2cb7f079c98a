// Daylight removed by paired readings: lights on, then off, back to back at the same point. The
// electric light is E_on - E_off (German workplace rule ASR A3.4, section 7.3, describes the method;
// not valid where daylight controls dim the lighting).
import { COVERAGE_K } from './uncertainty';

/**
 * The lights-on and lights-off readings of a pair may be at most this far apart (project's own
 * choice: long enough to walk to a switch and back, short enough that an overcast sky stays steady).
 */
export const MAX_PAIR_GAP_MS = 5 * 60_000;

export interface PairInput {
  lux: number;
  /** Expanded uncertainty (k = 2), lux. */
  uLux: number;
  timeMs: number;
}

export type PairedSubtraction =
  | { ok: true; lux: number; uLux: number; gapMs: number }
  | { ok: false; reason: string };

/**
 * E = E_on - E_off with u(E) = sqrt(u(E_on)^2 + u(E_off)^2) (GUM 5.1.2, sensitivity coefficients
 * +1 and -1). The two readings are taken as independent: with one meter its scale error partly
 * cancels, so this overstates rather than hides the uncertainty. Refused when they are further
 * apart than maxGapMs, or when the lights-off reading is the larger (the daylight changed, or
 * the readings were swapped).
 */
export function pairedSubtraction(on: PairInput, off: PairInput, maxGapMs = MAX_PAIR_GAP_MS): PairedSubtraction {
  const gapMs = Math.abs(on.timeMs - off.timeMs);
  if (!(gapMs <= maxGapMs)) {
    return { ok: false, reason: `The lights-on and lights-off readings are ${Math.round(gapMs / 1000)} s apart; a pair may be at most ${maxGapMs / 1000} s apart` };
  }
  if (off.lux > on.lux) {
    return { ok: false, reason: `The lights-off reading (${off.lux} lx) is higher than the lights-on reading (${on.lux} lx): the daylight changed between them, or they were swapped` };
  }
  const uOn = on.uLux / COVERAGE_K;
  const uOff = off.uLux / COVERAGE_K;
  return { ok: true, lux: on.lux - off.lux, uLux: COVERAGE_K * Math.hypot(uOn, uOff), gapMs };
}
