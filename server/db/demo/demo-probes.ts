/**
 * The demo organisation's probes and their calibration (invented values, plausible in
 * magnitude). Seeded by the calibration feature; the survey-log feature simulates logs
 * with the same coefficients so that the demo decodes to the levels of library-layout.ts.
 */
export type DemoCountingProbe = {
  serial: string;
  description: string;
  fullScaleCounts: number;
  saturationCounts: number;
  floorCounts: number;
  gains: { code: number; nominalGain: number }[];
  /** Per gain code: dark counts and lux per count at tRefMs. */
  coefficients: { code: number; darkCounts: number; luxPerCount: number; uRel: number }[];
  tRefMs: number;
  alphaPerK: number;
  tCalC: number;
  /** Due date relative to the seed time, days (negative: overdue). */
  dueInDays: number;
  certificateNumber: string;
};

const gains4 = [
  { code: 0, nominalGain: 1 },
  { code: 1, nominalGain: 8 },
  { code: 2, nominalGain: 64 },
  { code: 3, nominalGain: 512 },
];

/** luxPerCount at gain code 0 for a probe that saturates near 130 klx at the lowest gain. */
function ladder(base: number, dark: number[], mismatch: number[] = [1, 1, 1, 1]) {
  return gains4.map((g, i) => ({ code: g.code, darkCounts: dark[i], luxPerCount: (base / g.nominalGain) * mismatch[i], uRel: 0.012 + 0.002 * i }));
}

export const DEMO_COUNTING_PROBES: DemoCountingProbe[] = [
  {
    serial: 'LX-4102', description: 'Tripod probe, indoor grid work', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200,
    gains: gains4, coefficients: ladder(2.0, [48, 52, 61, 90], [1, 1.004, 0.997, 1.006]), tRefMs: 100, alphaPerK: -0.0012, tCalC: 23, dueInDays: 160, certificateNumber: 'FCT-CAL-2026-0311',
  },
  {
    serial: 'LX-4107', description: 'Handheld probe, corridors and stairs', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200,
    gains: gains4, coefficients: ladder(2.05, [40, 44, 57, 85], [1, 0.996, 1.003, 0.994]), tRefMs: 100, alphaPerK: -0.0011, tCalC: 23, dueInDays: 12, certificateNumber: 'FCT-CAL-2026-0188',
  },
  {
    serial: 'LX-3990', description: 'Spare probe, awaiting recalibration', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200,
    gains: gains4, coefficients: ladder(1.97, [50, 55, 66, 98]), tRefMs: 100, alphaPerK: -0.0013, tCalC: 23, dueInDays: -21, certificateNumber: 'FCT-CAL-2025-0977',
  },
];

/** A roof-mounted 4-20 mA daylight reference transmitter, log10 scaled over five decades. */
export const DEMO_ANALOG_PROBE = {
  serial: 'RF-20-07', description: 'Roof daylight reference, 4-20 mA, log scale', kind: 'current_4_20' as const,
  rangeLowLux: 1, rangeHighLux: 150000, scale: 'log10' as const, accuracyPercent: 0.5,
  coefficients: [{ code: 0, darkCounts: 0, luxPerCount: 1, uRel: 0.025 }], tRefMs: 100, alphaPerK: 0, tCalC: 20, dueInDays: 200, certificateNumber: 'FCT-CAL-2026-0402',
};
