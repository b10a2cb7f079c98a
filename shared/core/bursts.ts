import { createCoefficientSelector, type CoefficientSelector } from './coefficient-sets';
import { compiledFor, sampleBudget, validateSample, type CompiledCoefficients } from './decode-counts';
import { DecodeError } from './errors';
import type { CoefficientSet, CountingProbe, CountSample, Reading, ReadingFlag, RejectedSample } from './types';
import { combineBudget, COVERAGE_K } from './uncertainty';

/** Samples of one probe at one point within this many seconds of the burst's first sample form one burst. */
export const DEFAULT_BURST_WINDOW_SECONDS = 10;

/** A reading whose expanded relative uncertainty exceeds this is flagged low_confidence (project's own choice). */
export const LOW_CONFIDENCE_EXPANDED_REL = 0.2;

export interface ProbeConfig {
  probe: CountingProbe;
  /** All coefficient sets of the probe; unapproved ones are ignored. */
  sets: readonly CoefficientSet[];
}

export interface BurstAssemblerOptions {
  /** Probe key (as in CountSample.probe) -> probe and its coefficient sets. */
  probes: ReadonlyMap<string, ProbeConfig> | Readonly<Record<string, ProbeConfig>>;
  burstWindowSeconds?: number;
  /**
   * Called for an invalid sample (it is skipped; its burst stays open). sampleIndex counts every
   * pushed sample from 0. Without onError the DecodeError is thrown from push().
   */
  onError?: (error: DecodeError, sample: CountSample, sampleIndex: number) => void;
}

export interface BurstAssembler {
  /** Adds one sample in file order; returns the reading of a burst this sample closed, else null. */
  push(sample: CountSample): Reading | null;
  /** Closes every open burst (end of file); returns their readings in order of first sample. */
  flush(): Reading[];
  /** Samples pushed so far (valid or not). */
  readonly samplesSeen: number;
}

const ST_OK = 0;
const ST_SAT = 1;
const ST_LOW = 2;

/** One probe's open burst and its coefficient-set cache; typed arrays reused across bursts. */
class ProbeState {
  readonly key: string;
  readonly probe: CountingProbe;
  readonly selector: CoefficientSelector;
  readonly compiled: (CompiledCoefficients | undefined)[];
  // Current coefficient set covers [curFrom, curTo).
  cur: CompiledCoefficients | null = null;
  curFrom = Infinity;
  curTo = -Infinity;

  open = false;
  point = '';
  t0 = 0;
  firstSeq = 0;
  n = 0;
  best = -1;
  bestGain = -Infinity;
  times: Float64Array = new Float64Array(8);
  counts: Float64Array = new Float64Array(8);
  intMs: Float64Array = new Float64Array(8);
  tempC: Float64Array = new Float64Array(8);
  slot: Int32Array = new Int32Array(8);
  status: Uint8Array = new Uint8Array(8);
  comp: CompiledCoefficients[] = [];

  constructor(key: string, cfg: ProbeConfig) {
    this.key = key;
    this.probe = cfg.probe;
    this.selector = createCoefficientSelector(cfg.sets);
    this.compiled = new Array(this.selector.sets.length);
  }

  /** Coefficient set in force at t, compiled; null when none. */
  compAt(t: number): CompiledCoefficients | null {
    if (t >= this.curFrom && t < this.curTo) return this.cur;
    const sets = this.selector.sets;
    const set = this.selector.select(t);
    if (set === null) {
      this.cur = null;
      this.curFrom = -Infinity;
      this.curTo = sets.length > 0 ? sets[0].effectiveFrom : Infinity;
      return null;
    }
    const i = sets.lastIndexOf(set);
    let c = this.compiled[i];
    if (c === undefined) {
      c = compiledFor(this.probe, set);
      this.compiled[i] = c;
    }
    this.cur = c;
    this.curFrom = set.effectiveFrom;
    this.curTo = i + 1 < sets.length ? sets[i + 1].effectiveFrom : Infinity;
    return c;
  }

  grow(): void {
    const m = this.times.length * 2;
    const f = (a: Float64Array): Float64Array => {
      const b = new Float64Array(m);
      b.set(a);
      return b;
    };
    this.times = f(this.times);
    this.counts = f(this.counts);
    this.intMs = f(this.intMs);
    this.tempC = f(this.tempC);
    const s = new Int32Array(m);
    s.set(this.slot);
    this.slot = s;
    const st = new Uint8Array(m);
    st.set(this.status);
    this.status = st;
  }
}

/** E at counts c (NaN intMs / tempC mean absent): the decoding model of decode-counts.ts. */
function luxAt(comp: CompiledCoefficients, slot: number, c: number, intMs: number, tempC: number): number {
  const set = comp.set;
  const tRatio = intMs === intMs ? set.tRefMs / intMs : 1;
  const tf = tempC === tempC ? 1 + set.alphaPerK * (tempC - set.tCalC) : 1;
  return ((c - comp.dark[slot]) * comp.luxPerCount[slot] * tRatio) / tf;
}

/** Builds the reading of a closed burst (see createBurstAssembler for the choice rule). */
function closeBurst(s: ProbeState): Reading {
  const n = s.n;
  const probe = s.probe;
  const rejected: RejectedSample[] = [];
  let pick = s.best;
  let luxBound: Reading['luxBound'] = 'exact';
  let rangeFlag: ReadingFlag | null = null;
  let bound = 0;
  if (pick < 0) {
    // No usable sample. Any saturation: over range, lower bound = the largest saturation lux among the
    // saturated samples (the lowest gain sampled; a saturated sample proves no more). Otherwise under
    // range, upper bound = the smallest detection limit (floorCounts at the highest gain sampled).
    let anySat = false;
    for (let i = 0; i < n; i++) if (s.status[i] === ST_SAT) anySat = true;
    for (let i = 0; i < n; i++) {
      const st = s.status[i];
      if (anySat ? st !== ST_SAT : st !== ST_LOW) continue;
      const comp = s.comp[i];
      const c = anySat ? probe.saturationCounts : comp.dark[s.slot[i]] + probe.floorCounts;
      const e = luxAt(comp, s.slot[i], c, s.intMs[i], s.tempC[i]);
      if (pick < 0 || (anySat ? e > bound : e < bound)) {
        pick = i;
        bound = e;
      }
    }
    luxBound = anySat ? 'lower' : 'upper';
    rangeFlag = anySat ? 'over_range' : 'under_range';
  }
  for (let i = 0; i < n; i++) {
    const st = s.status[i];
    if (st === ST_SAT) rejected.push({ index: i, reason: 'saturated' });
    else if (st === ST_LOW) rejected.push({ index: i, reason: 'low_signal' });
    else if (i !== pick) {
      rejected.push({ index: i, reason: s.comp[i].nominalGain[s.slot[i]] < s.bestGain ? 'lower_gain' : 'repeat_gain' });
    }
  }
  const comp = s.comp[pick];
  const slot = s.slot[pick];
  const tempKnown = s.tempC[pick] === s.tempC[pick];
  let lux: number;
  let net: number;
  if (rangeFlag === null) {
    lux = luxAt(comp, slot, s.counts[pick], s.intMs[pick], s.tempC[pick]);
    net = s.counts[pick] - comp.dark[slot];
  } else {
    lux = bound;
    net = luxBound === 'lower' ? probe.saturationCounts - comp.dark[slot] : probe.floorCounts;
  }
  const budget = sampleBudget(comp, slot, net, tempKnown);
  const uRel = combineBudget(budget);
  const timeMs = rangeFlag === null ? s.times[pick] : s.t0;
  const flags: ReadingFlag[] = [];
  if (rangeFlag !== null) flags.push(rangeFlag);
  if (comp.set.dueDate !== null && timeMs > comp.set.dueDate) flags.push('calibration_lapsed');
  if (rangeFlag === null && COVERAGE_K * uRel > LOW_CONFIDENCE_EXPANDED_REL) flags.push('low_confidence');
  if (flags.length === 0) flags.push('ok');
  return {
    probe: s.key,
    point: s.point,
    timeMs,
    lux,
    luxBound,
    flag: flags[0],
    flags,
    gainCode: comp.codes[slot],
    samples: n,
    chosenSample: rangeFlag === null ? pick : null,
    rejected,
    uRel,
    uLux: COVERAGE_K * uRel * Math.abs(lux),
    budget,
    coefficientSetId: comp.set.id,
    evidence: { counts: s.counts[pick], intMs: nanToNull(s.intMs[pick]), tempC: nanToNull(s.tempC[pick]) },
  };
}

const nanToNull = (v: number): number | null => (v === v ? v : null);

class Assembler implements BurstAssembler {
  private readonly states = new Map<string, ProbeState>();
  private readonly configs: ReadonlyMap<string, ProbeConfig>;
  private readonly windowMs: number;
  private readonly onError: BurstAssemblerOptions['onError'];
  private lastKey: string | null = null;
  private last: ProbeState | null = null;
  private seq = 0;
  samplesSeen = 0;

  constructor(o: BurstAssemblerOptions) {
    this.configs = o.probes instanceof Map ? o.probes : new Map(Object.entries(o.probes as Record<string, ProbeConfig>));
    const w = o.burstWindowSeconds ?? DEFAULT_BURST_WINDOW_SECONDS;
    if (!(w >= 0 && w < Infinity)) throw new DecodeError('bad_input', `Burst window ${w} s is not a non-negative number.`);
    this.windowMs = w * 1000;
    this.onError = o.onError;
  }

  private stateFor(key: string): ProbeState | null {
    if (key === this.lastKey) return this.last;
    let st = this.states.get(key);
    if (st === undefined) {
      const cfg = this.configs.get(key);
      if (cfg === undefined) return null;
      st = new ProbeState(key, cfg);
      this.states.set(key, st);
    }
    this.lastKey = key;
    this.last = st;
    return st;
  }

  private fail(err: DecodeError, sample: CountSample, index: number): null {
    if (this.onError === undefined) throw err;
    this.onError(err, sample, index);
    return null;
  }

  /** Slow path: find the exact reason a sample is invalid. */
  private invalid(s: ProbeState, comp: CompiledCoefficients, sample: CountSample, index: number): null {
    try {
      validateSample(comp, sample.gainCode, sample.counts, sample.intMs, sample.tempC);
    } catch (e) {
      if (e instanceof DecodeError) return this.fail(e, sample, index);
      throw e;
    }
    return this.fail(new DecodeError('bad_input', `Sample of probe ${s.key} is invalid.`), sample, index);
  }

  push(sample: CountSample): Reading | null {
    const index = this.samplesSeen++;
    const st = this.stateFor(sample.probe);
    if (st === null) return this.fail(new DecodeError('unknown_probe', `Probe ${sample.probe} is not known.`, { probe: sample.probe }), sample, index);
    const t = sample.timeMs;
    if (!Number.isFinite(t)) return this.fail(new DecodeError('bad_time', `Sample time ${t} is not a number.`, { timeMs: t }), sample, index);
    const comp = st.compAt(t);
    if (comp === null) {
      return this.fail(new DecodeError('no_coefficient_set', `Probe ${st.key} has no approved coefficient set in force at ${new Date(t).toISOString()}.`, { timeMs: t }), sample, index);
    }
    // Fast validation; the slow path names the reason.
    const code = sample.gainCode;
    const c = sample.counts;
    const intMs = sample.intMs;
    const tempC = sample.tempC;
    const slot = code >= 0 && code < comp.slotOfCode.length ? comp.slotOfCode[code | 0] : -1;
    if (
      slot < 0 || (code | 0) !== code || !Number.isInteger(c) || c < 0 || c > st.probe.fullScaleCounts ||
      (intMs !== undefined && !(intMs > 0 && intMs < Infinity)) ||
      (tempC !== undefined && !(1 + comp.set.alphaPerK * (tempC - comp.set.tCalC) > 0))
    ) {
      return this.invalid(st, comp, sample, index);
    }

    let out: Reading | null = null;
    if (st.open && (sample.point !== st.point || t - st.t0 > this.windowMs || t < st.t0)) {
      out = closeBurst(st);
      st.open = false;
    }
    if (!st.open) {
      st.open = true;
      st.point = sample.point;
      st.t0 = t;
      st.firstSeq = this.seq++;
      st.n = 0;
      st.best = -1;
      st.bestGain = -Infinity;
    }
    const i = st.n;
    if (i === st.times.length) st.grow();
    st.n = i + 1;
    st.times[i] = t;
    st.counts[i] = c;
    st.intMs[i] = intMs === undefined ? NaN : intMs;
    st.tempC[i] = tempC === undefined ? NaN : tempC;
    st.slot[i] = slot;
    st.comp[i] = comp;
    let status = ST_OK;
    if (c >= st.probe.saturationCounts) status = ST_SAT;
    else if (c - comp.dark[slot] < st.probe.floorCounts) status = ST_LOW;
    st.status[i] = status;
    if (status === ST_OK) {
      const g = comp.nominalGain[slot];
      if (g > st.bestGain) {
        st.bestGain = g;
        st.best = i;
      }
    }
    return out;
  }

  flush(): Reading[] {
    const open = [...this.states.values()].filter((s) => s.open).sort((a, b) => a.firstSeq - b.firstSeq);
    const out = open.map((s) => closeBurst(s));
    for (const s of open) {
      s.open = false;
      s.comp.length = 0;
    }
    return out;
  }
}

/**
 * Streaming auto-ranging. Consecutive samples of one probe at one point label, each within
 * burstWindowSeconds of the burst's FIRST sample (t - t0 <= window), form one burst; a new point
 * label, a later sample beyond the window, or a time going backwards closes it. Probes interleave:
 * one open burst per probe. The reading is the sample with the highest nominal gain that is
 * neither saturated (C >= saturationCounts) nor low-signal (C - dark < floorCounts); at equal gain
 * the first. None usable: over range with a lower bound if any sample saturated, else under
 * range with an upper bound (DOMAIN.md 2). Each sample uses the coefficient set in force at its time.
 */
export function createBurstAssembler(options: BurstAssemblerOptions): BurstAssembler {
  return new Assembler(options);
}

/** Convenience: runs a whole sequence through one assembler and returns all readings. */
export function assembleBursts(samples: Iterable<CountSample>, options: BurstAssemblerOptions): Reading[] {
  const a = createBurstAssembler(options);
  const out: Reading[] = [];
  for (const s of samples) {
    const r = a.push(s);
    if (r !== null) out.push(r);
  }
  for (const r of a.flush()) out.push(r);
  return out;
}
