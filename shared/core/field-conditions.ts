// Measurement conditions of a survey session and the warnings they give a reading.

/**
 * Lamps need time after switching on before their output is stable: 30 minutes (common practice,
 * given for discharge lamps in secondary sources). Readings taken sooner are warned about.
 */
export const WARM_UP_MS = 30 * 60_000;

/** New fluorescent lamps are burnt in for about 100 hours before measuring (secondary source). */
export const BURN_IN_HOURS = 100;

export const SKY_STATES = ['overcast', 'clear', 'night'] as const;
export type SkyState = (typeof SKY_STATES)[number];

export interface SessionConditions {
  /** Epoch ms the lights were switched on; null: not recorded. */
  lightsOnAt: number | null;
  sky: SkyState | null;
  lampBurnInHours: number | null;
}

export type ConditionWarningCode = 'before_warm_up' | 'before_lights_on' | 'daylight_not_excluded' | 'lamps_not_burnt_in';

export interface ConditionWarning {
  code: ConditionWarningCode;
  message: string;
}

/**
 * Warnings for one reading taken at timeMs in a session: before the lights were on, before the
 * warm-up time had passed, lamps not burnt in, or in daylight when the survey says daylight was
 * excluded (a paired lights-on/off reading has its daylight removed, so it is not warned about).
 */
export function conditionWarnings(
  timeMs: number,
  session: SessionConditions | null,
  survey: { daylightExcluded: boolean },
  reading: { paired: boolean } = { paired: false },
  warmUpMs = WARM_UP_MS,
): ConditionWarning[] {
  const out: ConditionWarning[] = [];
  if (session?.lightsOnAt != null) {
    if (timeMs < session.lightsOnAt) {
      out.push({ code: 'before_lights_on', message: 'Taken before the lights were switched on' });
    } else if (timeMs - session.lightsOnAt < warmUpMs) {
      const min = Math.floor((timeMs - session.lightsOnAt) / 60_000);
      out.push({ code: 'before_warm_up', message: `Taken ${min} min after the lights went on; Luxtrail asks for ${warmUpMs / 60_000} min of warm-up (common practice)` });
    }
  }
  if (session?.lampBurnInHours != null && session.lampBurnInHours < BURN_IN_HOURS) {
    out.push({ code: 'lamps_not_burnt_in', message: `Lamps burnt in for ${session.lampBurnInHours} h; new lamps are usually burnt in for about ${BURN_IN_HOURS} h first (secondary source)` });
  }
  if (survey.daylightExcluded && !reading.paired && session !== null && session.sky !== 'night') {
    out.push({ code: 'daylight_not_excluded', message: `Taken ${session.sky === null ? 'with no sky recorded' : `under a ${session.sky} sky`} although the survey says daylight was excluded; measure at night or as a lights-on/off pair` });
  }
  return out;
}
