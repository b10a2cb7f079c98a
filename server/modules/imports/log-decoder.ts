import { createBurstAssembler } from '../../../shared/core/bursts';
import { decodeAnalog } from '../../../shared/core/analog';
import { createCoefficientSelector, isCalibrationLapsed, type CoefficientSelector } from '../../../shared/core/coefficient-sets';
import { DecodeError, type DecodeErrorCode } from '../../../shared/core/errors';
import type { AnalogProbe, BudgetPart, LuxBound, Reading, ReadingFlag } from '../../../shared/core/types';
import type { DecodingCalibration } from '../probes/probe-calibration';
import type { ReadingPlane } from '../../../shared/core/planes';

/** One sample as the decoder takes it: parsed from a log row, or read back from the samples table. */
export type LogSample = {
  line: number;
  timeMs: number;
  /** The probe's serial. */
  probe: string;
  point: string;
  gainCode?: number;
  counts?: number;
  ma?: number;
  volts?: number;
  intMs?: number;
  tempC?: number;
  xM: number | null;
  yM: number | null;
  /** The plan xM, yM refer to; null when unknown. */
  planId: number | null;
  role: 'task' | 'reference';
  note: string | null;
  /** Where the sensor faced (absent: horizontal) and, for vertical readings, its azimuth in degrees. */
  plane?: ReadingPlane;
  azimuthDeg?: number | null;
};

export type DecodedReading = {
  probeId: number;
  point: string;
  xM: number | null;
  yM: number | null;
  planId: number | null;
  role: 'task' | 'reference';
  note: string | null;
  /** Absent: horizontal. */
  plane?: ReadingPlane;
  azimuthDeg?: number | null;
  timeMs: number;
  lux: number | null;
  uLux: number | null;
  luxBound: LuxBound;
  flag: ReadingFlag;
  gainCode: number | null;
  samples: number;
  chosenSample: number | null;
  coefficientSetId: number | null;
  budget: BudgetPart[];
  /** The raw evidence behind the value or bound, as logged: counts (counting probes) or the mA / V signal (analog), integration time, temperature. */
  rawCounts: number | null;
  rawSignal: number | null;
  intMs: number | null;
  tempC: number | null;
};

/** A problem with one sample: the line, the log column it concerns, the value and what is wrong. */
export type SampleProblem = { line: number; column: string; value: string; message: string };

const COLUMN_OF_CODE: Partial<Record<DecodeErrorCode, string>> = {
  unknown_probe: 'probe', unknown_gain: 'gain', counts_out_of_range: 'counts', counts_not_integer: 'counts',
  bad_integration_time: 'int_ms', bad_temperature: 'temp_c', bad_time: 'timestamp', no_coefficient_set: 'timestamp', bad_probe: 'probe',
};

const KIND_LABEL = { counts: 'a counting probe', current_4_20: 'a 4-20 mA probe', voltage_0_10: 'a 0-10 V probe' } as const;

function valueOf(sample: LogSample, column: string): string {
  const v: Record<string, unknown> = {
    probe: sample.probe, gain: sample.gainCode, counts: sample.counts, int_ms: sample.intMs, temp_c: sample.tempC,
    timestamp: new Date(sample.timeMs).toISOString(), ma: sample.ma, volts: sample.volts,
  };
  return v[column] === undefined ? '' : String(v[column]);
}

type BurstMeta = Pick<LogSample, 'point' | 'xM' | 'yM' | 'planId' | 'role' | 'note' | 'plane' | 'azimuthDeg'>;

/**
 * What the burst assembler groups by: the point label, and for readings off the horizontal plane
 * also plane and azimuth, so four vertical readings at one point in quick succession stay four readings.
 */
function burstKey(s: LogSample): string {
  const plane = s.plane ?? 'horizontal';
  return plane === 'horizontal' ? s.point : `${s.point}\u001f${plane}\u001f${s.azimuthDeg ?? ''}`;
}

/**
 * Decodes a log's samples in file order with the measurement core: counting probes through the
 * streaming burst assembler (auto-ranging), analog probes one sample per reading with NE 43 /
 * 0-10 V classification. Each sample uses the approved coefficient set in force at its time.
 * The reading's position, plan, role and note are those of its burst's first sample.
 */
export function createLogDecoder(calibration: ReadonlyMap<string, DecodingCalibration>, onReading: (r: DecodedReading) => void, onProblem: (p: SampleProblem) => void) {
  const counting = new Map<string, { probe: Extract<DecodingCalibration['probe'], { kind: 'counts' }>; sets: DecodingCalibration['sets'] }>();
  const analogSelectors = new Map<string, CoefficientSelector>();
  for (const [serial, c] of calibration) {
    if (c.probe.kind === 'counts') counting.set(serial, { probe: c.probe, sets: c.sets });
    else analogSelectors.set(serial, createCoefficientSelector(c.sets));
  }
  let currentLine = 0;
  let current: LogSample | null = null;
  const assembler = createBurstAssembler({
    probes: counting,
    onError: (err) => {
      const column = COLUMN_OF_CODE[err.code] ?? 'counts';
      onProblem({ line: currentLine, column, value: current ? valueOf(current, column) : '', message: err.message });
    },
  });
  const openBurst = new Map<string, BurstMeta>();

  const emit = (r: Reading, meta: BurstMeta, analog?: LogSample) => {
    onReading({
      probeId: calibration.get(r.probe)!.probeId, point: meta.point, xM: meta.xM, yM: meta.yM, planId: meta.planId, role: meta.role, note: meta.note,
      plane: meta.plane ?? 'horizontal', azimuthDeg: meta.azimuthDeg ?? null,
      rawCounts: r.evidence?.counts ?? null, rawSignal: analog ? (analog.ma ?? analog.volts ?? null) : null,
      intMs: analog ? (analog.intMs ?? null) : (r.evidence?.intMs ?? null), tempC: analog ? (analog.tempC ?? null) : (r.evidence?.tempC ?? null),
      timeMs: r.timeMs, lux: r.lux, uLux: r.lux === null ? null : r.uLux, luxBound: r.luxBound, flag: r.flag, gainCode: r.gainCode,
      samples: r.samples, chosenSample: r.chosenSample, coefficientSetId: r.coefficientSetId === null ? null : Number(r.coefficientSetId), budget: r.budget,
    });
  };

  const problem = (s: LogSample, column: string, message: string) => onProblem({ line: s.line, column, value: valueOf(s, column), message });

  function pushAnalog(s: LogSample, probe: AnalogProbe) {
    const signal = probe.kind === 'current_4_20' ? s.ma : s.volts;
    const signalColumn = probe.kind === 'current_4_20' ? 'ma' : 'volts';
    if (signal === undefined) {
      const has = s.counts !== undefined || s.gainCode !== undefined ? ' (this row has gain/counts)' : '';
      return problem(s, signalColumn, `Probe ${s.probe} is ${KIND_LABEL[probe.kind]}: the row needs a ${signalColumn} value${has}`);
    }
    if (s.counts !== undefined || s.gainCode !== undefined || (probe.kind === 'current_4_20' ? s.volts : s.ma) !== undefined) {
      return problem(s, s.counts !== undefined ? 'counts' : s.gainCode !== undefined ? 'gain' : probe.kind === 'current_4_20' ? 'volts' : 'ma',
        `Probe ${s.probe} is ${KIND_LABEL[probe.kind]}: give only its ${signalColumn} signal on this row`);
    }
    const set = analogSelectors.get(s.probe)!.select(s.timeMs);
    if (set === null) return problem(s, 'timestamp', `Probe ${s.probe} has no approved coefficient set in force at ${new Date(s.timeMs).toISOString()}.`);
    const r = decodeAnalog(probe, { probe: s.probe, point: s.point, timeMs: s.timeMs, signal }, set.gains[0]?.uRel ?? 0);
    // The core flags the signal; lapsed calibration is added here in the core's order of importance.
    const lapsed = isCalibrationLapsed(set, s.timeMs);
    const flag: ReadingFlag = lapsed && r.flag === 'ok' ? 'calibration_lapsed' : r.flag;
    emit({ ...r, flag, coefficientSetId: set.id }, s, s);
  }

  return {
    push(s: LogSample): void {
      const cal = calibration.get(s.probe);
      if (cal === undefined) return problem(s, 'probe', `Probe ${s.probe} is not registered in this organisation`);
      if (cal.probe.kind === 'manual') return problem(s, 'probe', `Probe ${s.probe} is a hand-held meter without a log: type its values in the field view`);
      if (cal.probe.kind !== 'counts') return pushAnalog(s, cal.probe);
      if (s.gainCode === undefined || s.counts === undefined) {
        const has = s.ma !== undefined ? ' (this row has ma)' : s.volts !== undefined ? ' (this row has volts)' : '';
        return problem(s, s.gainCode === undefined ? 'gain' : 'counts', `Probe ${s.probe} is ${KIND_LABEL.counts}: the row needs gain and counts${has}`);
      }
      if (s.ma !== undefined || s.volts !== undefined) {
        return problem(s, s.ma !== undefined ? 'ma' : 'volts', `Probe ${s.probe} is ${KIND_LABEL.counts}: give only gain and counts on this row`);
      }
      currentLine = s.line;
      current = s;
      let r: Reading | null;
      try {
        r = assembler.push({ probe: s.probe, point: burstKey(s), timeMs: s.timeMs, gainCode: s.gainCode, counts: s.counts, intMs: s.intMs, tempC: s.tempC });
      } catch (e) {
        if (e instanceof DecodeError) return problem(s, COLUMN_OF_CODE[e.code] ?? 'probe', e.message);
        throw e;
      }
      if (r !== null) {
        emit(r, openBurst.get(s.probe)!);
        openBurst.set(s.probe, s);
      } else if (!openBurst.has(s.probe)) openBurst.set(s.probe, s);
    },
    /** End of the samples: closes every open burst. */
    finish(): void {
      for (const r of assembler.flush()) emit(r, openBurst.get(r.probe)!);
      openBurst.clear();
    },
  };
}
