// Shared measurement types. All illuminances are in lux; times are epoch milliseconds.

/** One gain step of a counting probe: the code the probe logs and its nominal gain. */
export interface GainStep {
  code: number;
  nominalGain: number;
}

/** A digital probe: photodiode, programmable-gain amplifier, single-ended ADC. */
export interface CountingProbe {
  kind: 'counts';
  fullScaleCounts: number;
  /** A sample with C >= saturationCounts carries no value. */
  saturationCounts: number;
  /** A sample with C - dark < floorCounts is below the usable range at that gain. */
  floorCounts: number;
  gains: GainStep[];
}

/** A transmitter with a 4-20 mA loop or a 0-10 V output. */
export interface AnalogProbe {
  kind: 'current_4_20' | 'voltage_0_10';
  rangeLowLux: number;
  rangeHighLux: number;
  /** 'log10': log10(E) is linear in the signal (wide-range transmitters). */
  scale: 'linear' | 'log10';
  /** Transmitter accuracy, a rectangular bound in percent of the signal span. */
  accuracyPercent: number;
}

/** A hand-held meter that does not log: its values are typed (shared/core/typed-readings). */
export interface ManualProbe {
  kind: 'manual';
}

export type Probe = CountingProbe | AnalogProbe | ManualProbe;

/** Calibration coefficients of one gain code. */
export interface GainCoefficients {
  code: number;
  darkCounts: number;
  luxPerCount: number;
  /** Relative standard uncertainty of the calibration (k = 1). */
  uRel: number;
  /** Standard uncertainty of darkCounts, in counts (k = 1). Absent: DEFAULT_U_DARK_COUNTS. */
  uDarkCounts?: number;
}

/** A versioned coefficient set; never edited in place, a new version gets a new id. */
export interface CoefficientSet {
  id: string;
  /** Epoch ms; a sample exactly at effectiveFrom uses this set. */
  effectiveFrom: number;
  /** Epoch ms after which the calibration has lapsed, or null. */
  dueDate: number | null;
  /** Integration time the coefficients were measured at, ms. */
  tRefMs: number;
  /** Relative temperature coefficient of responsivity, 1/K. */
  alphaPerK: number;
  /** Calibration temperature, degC. */
  tCalC: number;
  gains: GainCoefficients[];
  /** Only approved sets decode data; absent means approved. */
  approved?: boolean;
}

/** A reading's flag. Stored codes (readings.flag and the index in a batch's numbers): append only. */
export const READING_FLAGS = ['ok', 'over_range', 'under_range', 'fault', 'calibration_lapsed', 'low_confidence'] as const;
export type ReadingFlag = (typeof READING_FLAGS)[number];

/** 'lower': the true value is at least lux; 'upper': at most lux. Stored codes. */
export const LUX_BOUNDS = ['exact', 'lower', 'upper'] as const;
export type LuxBound = (typeof LUX_BOUNDS)[number];

/** A reading of the task (judged) or of the reference probe (daylight, drift). Stored codes. */
export const READING_ROLES = ['task', 'reference'] as const;
export type ReadingRole = (typeof READING_ROLES)[number];

/**
 * The parts an uncertainty budget can have, in the order the core lists them (and stores them).
 * meter_class: a hand-held meter's class limit (DIN 5032-7) standing in for a certificate;
 * repeatability: the spread of several values typed at one point (standard deviation of their mean).
 */
export const BUDGET_PART_NAMES = ['calibration', 'quantisation', 'dark_offset', 'temperature', 'transmitter', 'meter_class', 'repeatability'] as const;
export type BudgetPartName = (typeof BUDGET_PART_NAMES)[number];

/** One relative standard uncertainty (k = 1) of a reading's budget. */
export interface BudgetPart {
  name: BudgetPartName;
  uRel: number;
}

export interface RejectedSample {
  index: number;
  /** lower_gain / repeat_gain: usable, but a higher (or the same, earlier) gain sample was chosen. */
  reason: 'saturated' | 'low_signal' | 'lower_gain' | 'repeat_gain';
}

/** One raw sample of a counting probe, as logged. */
export interface CountSample {
  probe: string;
  point: string;
  timeMs: number;
  gainCode: number;
  counts: number;
  /** Integration time, ms; absent means the set's tRefMs. */
  intMs?: number;
  /** Probe temperature, degC; absent means no correction and a wider budget. */
  tempC?: number;
}

/** One point's reading (a whole burst for a counting probe, one sample for an analog probe). */
export interface Reading {
  probe: string;
  point: string;
  /** Time of the chosen sample, else of the burst's first sample. */
  timeMs: number;
  /** null only for a fault. For over/under range it is the bound. */
  lux: number | null;
  luxBound: LuxBound;
  /** The most important flag: fault > over_range/under_range > calibration_lapsed > low_confidence > ok. */
  flag: ReadingFlag;
  /** Every flag that applies (never empty; ['ok'] when nothing applies). */
  flags: ReadingFlag[];
  gainCode: number | null;
  samples: number;
  /** Index of the chosen sample within the burst. */
  chosenSample: number | null;
  rejected: RejectedSample[];
  /** Combined relative standard uncertainty (k = 1). */
  uRel: number;
  /** EXPANDED uncertainty U = k * u_c (k = 2), lux. */
  uLux: number;
  budget: BudgetPart[];
  coefficientSetId: string | null;
  /** Counting probes: the logged sample behind the value or bound (counts, integration time, temperature as logged). */
  evidence?: { counts: number; intMs: number | null; tempC: number | null };
}
