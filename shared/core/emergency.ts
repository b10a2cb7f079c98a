// Emergency lighting: criteria sets as data, and the verdict of one escape route, open area,
// high-risk task area or safety-equipment point in one or more passes. Pure; lux throughout
// (a limit may be stated in foot-candles and is converted with the exact factor).
import { judgeLowerLimit, type AcceptanceRule, type VerdictKind } from './decision';
import { COVERAGE_K } from './uncertainty';
import { LUX_PER_FOOTCANDLE } from './units';
import { zoneStats, type StatBound } from './zone-stats';
import type { Reading } from './types';

export const EMERGENCY_ELEMENT_KINDS = ['escape_route', 'open_area', 'high_risk_area', 'safety_equipment'] as const;
export type EmergencyElementKind = (typeof EMERGENCY_ELEMENT_KINDS)[number];

/** Initial: right after the mains failed. End: at the end of the rated duration (battery) or the lowest supply voltage (central system). */
export const EMERGENCY_PASSES = ['initial', 'end_of_duration'] as const;
export type EmergencyPass = (typeof EMERGENCY_PASSES)[number];

/** Where a measured point lies in its element. */
export const EMERGENCY_POINT_ROLES = ['centre_line', 'central_band', 'area', 'border', 'equipment'] as const;
export type EmergencyPointRole = (typeof EMERGENCY_POINT_ROLES)[number];

/**
 * Which points a check looks at: the route's centre line; the central band (its centre-line
 * points and the band's); an area's points less its border; an equipment point; or all of an
 * element's points except an open area's border (NFPA's "path of egress").
 */
export const EMERGENCY_SCOPES = ['centre_line', 'central_band', 'area', 'equipment', 'all'] as const;
export type EmergencyScope = (typeof EMERGENCY_SCOPES)[number];

export type LimitUnit = 'lx' | 'fc';
export interface Limit { value: number; unit: LimitUnit }

interface CheckBase {
  /** Unique within its set. */
  id: string;
  /** Element kinds the check applies to. */
  appliesTo: EmergencyElementKind[];
  /** 'each': judged in every pass measured. */
  pass: EmergencyPass | 'each';
  /** The clause or source, kept beside the value (marks such as "from memory" included). */
  source: string;
}

export type EmergencyCheck =
  | (CheckBase & { kind: 'min'; scope: EmergencyScope; limit: Limit })
  | (CheckBase & { kind: 'average'; scope: EmergencyScope; limit: Limit })
  /** Emax:Emin at most maxRatio (judged as Emin/Emax >= 1/maxRatio, so the guard band is the ratio's own). */
  | (CheckBase & { kind: 'max_min_ratio'; scope: EmergencyScope; maxRatio: number })
  /** Emin/Emax at least minRatio. */
  | (CheckBase & { kind: 'min_over_max'; scope: EmergencyScope; minRatio: number })
  /** Every point at least max(share x the normal lighting's maintained illuminance, floor). */
  | (CheckBase & { kind: 'share_of_normal'; scope: EmergencyScope; share: number; floor: Limit })
  /** share (0.5 = half, 1 = all) of the required level reached within withinS seconds of the mains failing. */
  | (CheckBase & { kind: 'response'; share: number; withinS: number })
  /** Routes wider than this are judged strip by strip (strips of at most this width, each as a route). */
  | (CheckBase & { kind: 'route_width'; maxWidthM: number });

export interface EmergencyCriteriaSet {
  key: string;
  name: string;
  /** What the set stands on, printed in reports. */
  source: string;
  /** Passes without which compliance is not shown. */
  requiredPasses: EmergencyPass[];
  checks: EmergencyCheck[];
  notes: string[];
}

const EN1838 = 'EN 1838:2013 (secondary sources; check against the text)';

/**
 * Widest escape route judged as one route: wider ones are taken as several strips of at most
 * this width (EN 1838:2013 via secondary sources: "wider routes as several 2 m strips").
 */
export const ROUTE_STRIP_MAX_M = 2;

/** How many equal strips of at most maxStripM a route of widthM is taken as (1 up to maxStripM). */
export function routeStripCount(widthM: number, maxStripM = ROUTE_STRIP_MAX_M): number {
  return widthM > maxStripM + 1e-9 ? Math.ceil(widthM / maxStripM - 1e-9) : 1;
}

/** EN 1838:2013, as summarised in secondary sources (see DOMAIN.md section 11). */
export const EN_1838_2013: EmergencyCriteriaSet = {
  key: 'en-1838-2013',
  name: 'EN 1838:2013',
  source: EN1838,
  requiredPasses: ['end_of_duration'],
  checks: [
    { id: 'route-centre-min', kind: 'min', appliesTo: ['escape_route'], scope: 'centre_line', pass: 'each', limit: { value: 1, unit: 'lx' }, source: `${EN1838}: at least 1 lx horizontal at floor level along the centre line (routes up to 2 m wide)` },
    { id: 'route-band-min', kind: 'min', appliesTo: ['escape_route'], scope: 'central_band', pass: 'each', limit: { value: 0.5, unit: 'lx' }, source: `${EN1838}: the central band, at least half the route's width, at least 50 % of the centre line's 1 lx` },
    { id: 'route-ratio', kind: 'max_min_ratio', appliesTo: ['escape_route'], scope: 'centre_line', pass: 'each', maxRatio: 40, source: `${EN1838}: Emax:Emin along the centre line at most 40:1` },
    { id: 'route-width', kind: 'route_width', appliesTo: ['escape_route'], pass: 'each', maxWidthM: ROUTE_STRIP_MAX_M, source: `${EN1838}: wider routes are taken as several 2 m strips or as open areas (Luxtrail judges each strip as a route)` },
    { id: 'open-min', kind: 'min', appliesTo: ['open_area'], scope: 'area', pass: 'each', limit: { value: 0.5, unit: 'lx' }, source: `${EN1838}: at least 0.5 lx at the floor over the area less a 0.5 m border` },
    { id: 'open-ratio', kind: 'max_min_ratio', appliesTo: ['open_area'], scope: 'area', pass: 'each', maxRatio: 40, source: `${EN1838}: Emax:Emin at most 40:1` },
    { id: 'high-risk-min', kind: 'share_of_normal', appliesTo: ['high_risk_area'], scope: 'area', pass: 'each', share: 0.1, floor: { value: 15, unit: 'lx' }, source: `${EN1838}: at least 10 % of the normal lighting's maintained illuminance and never below 15 lx (judged at every point: the stricter reading, project's choice)` },
    { id: 'high-risk-uniformity', kind: 'min_over_max', appliesTo: ['high_risk_area'], scope: 'area', pass: 'each', minRatio: 0.1, source: `${EN1838}: Emin/Emax at least 0.1` },
    { id: 'equipment-min', kind: 'min', appliesTo: ['safety_equipment'], scope: 'equipment', pass: 'each', limit: { value: 5, unit: 'lx' }, source: `${EN1838}: 5 lx at the floor at fire-fighting equipment, call points and first-aid points (from memory: check)` },
    { id: 'response-half', kind: 'response', appliesTo: ['escape_route', 'open_area'], pass: 'initial', share: 0.5, withinS: 5, source: `${EN1838}: 50 % of the required level within 5 s` },
    { id: 'response-full', kind: 'response', appliesTo: ['escape_route', 'open_area'], pass: 'initial', share: 1, withinS: 60, source: `${EN1838}: the full required level within 60 s` },
    { id: 'high-risk-response', kind: 'response', appliesTo: ['high_risk_area'], pass: 'initial', share: 1, withinS: 0.5, source: `${EN1838}: the full required level within 0.5 s` },
  ],
  notes: [
    'Values count direct light only; measure at the end of the rated duration (battery systems) or at the lowest supply voltage (central systems), with the normal lighting off and daylight excluded.',
    'A revision (a 2024 final draft) reportedly asks 1 lx over the whole central band; an organisation can add that as its own criteria set.',
  ],
};

const NFPA = 'NFPA 101 §7.9.2.1 (code text as quoted in secondary sources)';

/** NFPA 101 §7.9.2.1, limits in foot-candles converted with the exact factor. */
export const NFPA_101_7_9_2: EmergencyCriteriaSet = {
  key: 'nfpa-101-7.9.2',
  name: 'NFPA 101 §7.9.2',
  source: NFPA,
  requiredPasses: ['initial', 'end_of_duration'],
  checks: [
    { id: 'initial-average', kind: 'average', appliesTo: ['escape_route', 'open_area'], scope: 'all', pass: 'initial', limit: { value: 1, unit: 'fc' }, source: `${NFPA}: initially an average of at least 1 fc along the path of egress at floor level` },
    { id: 'initial-min', kind: 'min', appliesTo: ['escape_route', 'open_area'], scope: 'all', pass: 'initial', limit: { value: 0.1, unit: 'fc' }, source: `${NFPA}: initially at least 0.1 fc at any point` },
    { id: 'end-average', kind: 'average', appliesTo: ['escape_route', 'open_area'], scope: 'all', pass: 'end_of_duration', limit: { value: 0.6, unit: 'fc' }, source: `${NFPA}: at the end of 1½ hours an average of at least 0.6 fc` },
    { id: 'end-min', kind: 'min', appliesTo: ['escape_route', 'open_area'], scope: 'all', pass: 'end_of_duration', limit: { value: 0.06, unit: 'fc' }, source: `${NFPA}: at the end of 1½ hours at least 0.06 fc at any point` },
    { id: 'ratio', kind: 'max_min_ratio', appliesTo: ['escape_route', 'open_area'], scope: 'all', pass: 'each', maxRatio: 40, source: `${NFPA}: a maximum-to-minimum ratio of at most 40:1` },
  ],
  notes: [
    'Foot-candles are converted with the exact factor 1 fc = 10.763910417 lx (0.1 fc = 1.0764 lx); where a rounded lux value as often printed (10.8 lx, 1.1 lx) would give another verdict, the verdict says so.',
    'The code does not set levels for high-risk task areas or safety equipment; those elements are not judged under this set.',
  ],
};

export const BUILT_IN_CRITERIA_SETS: readonly EmergencyCriteriaSet[] = [EN_1838_2013, NFPA_101_7_9_2];

/** Exact lux of a limit: fc x 1/0.3048^2 (units.ts). */
export function limitLux(l: Limit): number {
  return l.unit === 'fc' ? l.value * LUX_PER_FOOTCANDLE : l.value;
}

/** The lux value a printed table would show for a foot-candle limit: one decimal place (common practice: 10.8, 1.1, 6.5, 0.6). */
export function printedLux(l: Limit): number {
  return Math.round(limitLux(l) * 10) / 10;
}

function fmtLux(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  return a >= 100 ? v.toFixed(0) : a >= 10 ? v.toFixed(1) : a >= 1 ? v.toFixed(2) : v.toPrecision(2);
}

function limitText(l: Limit): string {
  return l.unit === 'fc' ? `${l.value} fc (${limitLux(l).toPrecision(5)} lx)` : `${fmtLux(l.value)} lx`;
}

const ratioText = (minOverMax: number) => (minOverMax > 0 ? `${(1 / minOverMax).toPrecision(3)}:1` : 'unbounded (Emin is 0)');

/** A measured point of an element in one pass. */
export interface EmergencyPoint {
  label: string;
  role: EmergencyPointRole;
  pass: EmergencyPass;
  reading: Reading;
  /** A wide route's strip (1 = leftmost looking along the route), or null/absent. */
  strip?: number | null;
}

export interface EmergencyElementInput {
  kind: EmergencyElementKind;
  /** Escape routes: width in metres. */
  widthM?: number | null;
  /** High-risk task areas: the normal lighting's maintained illuminance, lux. */
  normalEmLux?: number | null;
  /** Seconds from the mains failing to half and to all of the required level, as typed by the surveyor. */
  response?: { toHalfS?: number | null; toFullS?: number | null } | null;
  points: readonly EmergencyPoint[];
}

export interface CheckResult {
  checkId: string;
  kind: EmergencyCheck['kind'];
  pass: EmergencyPass | null;
  verdict: VerdictKind;
  /** The figure judged: lux, Emin/Emax, or seconds. */
  value: number | null;
  valueBound: StatBound;
  /** Expanded uncertainty (k = 2) of value, where there is one. */
  uncertainty: number | null;
  /** The limit in the value's own unit (lux, ratio or seconds). */
  limit: number | null;
  /** The point the verdict turns on (the worst), where there is one. */
  worstPoint: string | null;
  text: string;
  source: string;
  /** Set when a foot-candle limit printed as rounded lux would have given another verdict. */
  roundingNote: string | null;
}

export interface PointResult {
  label: string;
  role: EmergencyPointRole;
  pass: EmergencyPass;
  lux: number | null;
  luxBound: Reading['luxBound'];
  uLux: number;
  flag: Reading['flag'];
  /** The strictest point limit that applies to this point in this pass (lux), or null if none. */
  limitLux: number | null;
  verdict: VerdictKind | 'not_judged';
}

export interface ElementResult {
  verdict: VerdictKind | 'not_judged';
  checks: CheckResult[];
  points: PointResult[];
  /** The lowest point of the element over all passes. */
  worstPoint: { label: string; pass: EmergencyPass; lux: number; luxBound: Reading['luxBound']; uLux: number } | null;
  reasons: string[];
}

function inScope(role: EmergencyPointRole, scope: EmergencyScope): boolean {
  switch (scope) {
    case 'centre_line': return role === 'centre_line';
    case 'central_band': return role === 'centre_line' || role === 'central_band';
    case 'area': return role === 'area';
    case 'equipment': return role === 'equipment';
    case 'all': return role !== 'border';
  }
}

function combine(verdicts: readonly VerdictKind[]): VerdictKind {
  return verdicts.includes('falls_short') ? 'falls_short' : verdicts.every((v) => v === 'meets') ? 'meets' : 'inconclusive';
}

const boundWord = (b: StatBound | Reading['luxBound']) => (b === 'lower' ? ' (a lower bound: over range)' : b === 'upper' ? ' (an upper bound: under range)' : '');

/** Guard band of one reading under the rule (its expanded uncertainty when guarded). */
const guard = (r: Reading, rule: AcceptanceRule) => (rule === 'guarded' ? r.uLux : 0);

/** Every point at least `limit` lux: each point judged on its own (ILAC-G8 rule), the worst named. Under-range points can only fall short or stay inconclusive. */
function judgeMin(points: readonly EmergencyPoint[], limit: number, rule: AcceptanceRule): { verdict: VerdictKind; worst: EmergencyPoint | null; perPoint: Map<EmergencyPoint, VerdictKind> } {
  const perPoint = new Map<EmergencyPoint, VerdictKind>();
  let worst: EmergencyPoint | null = null;
  for (const p of points) {
    const r = p.reading;
    const v = r.lux === null ? 'inconclusive' : judgeLowerLimit(r.lux, r.luxBound === 'exact' ? null : r.luxBound, guard(r, rule), limit);
    perPoint.set(p, v);
    if (r.lux !== null && (worst === null || r.lux < (worst.reading.lux as number))) worst = p;
  }
  return { verdict: points.length === 0 ? 'inconclusive' : combine([...perPoint.values()]), worst, perPoint };
}

/** Emin/Emax of the points with its bound and expanded uncertainty k * sqrt(u_rel(Emin)^2 + u_rel(Emax)^2) (uncorrelated: conservative, as zone-stats does for U0). */
function minOverMax(points: readonly EmergencyPoint[]) {
  const readings = points.map((p) => p.reading);
  const s = zoneStats(readings);
  const valued = points.filter((p) => p.reading.lux !== null);
  const lo = valued.reduce<EmergencyPoint | null>((a, p) => (a === null || (p.reading.lux as number) < (a.reading.lux as number) ? p : a), null);
  const hi = valued.reduce<EmergencyPoint | null>((a, p) => (a === null || (p.reading.lux as number) > (a.reading.lux as number) ? p : a), null);
  const ratio = s.minOverMax;
  const u = ratio !== null && lo && hi ? ratio * COVERAGE_K * Math.sqrt(lo.reading.uRel ** 2 + hi.reading.uRel ** 2) : null;
  return { ratio, bound: s.bounded.minOverMax, u, lo, hi, stats: s };
}

/**
 * Judges one element against a criteria set under the organisation's decision rule (guarded:
 * guard band U, k = 2; simple: the value as it is). Each check is judged in each pass it names;
 * the element meets only if every check meets and every pass the set requires was measured.
 */
export function judgeEmergencyElement(element: EmergencyElementInput, set: EmergencyCriteriaSet, rule: AcceptanceRule): ElementResult {
  const checks = set.checks.filter((c) => c.appliesTo.includes(element.kind));
  const widthCheck = checks.find((c): c is Extract<EmergencyCheck, { kind: 'route_width' }> => c.kind === 'route_width');
  if (element.kind === 'escape_route' && widthCheck && element.widthM != null && routeStripCount(element.widthM, widthCheck.maxWidthM) > 1) {
    return judgeRouteStrips(element, set, rule, widthCheck);
  }
  const reasons: string[] = [];
  const results: CheckResult[] = [];
  const measuredPasses = EMERGENCY_PASSES.filter((p) => element.points.some((pt) => pt.pass === p));
  const pointLimit = new Map<EmergencyPoint, { limit: number; verdict: VerdictKind }>();
  const notePoint = (p: EmergencyPoint, limit: number, v: VerdictKind) => {
    const prev = pointLimit.get(p);
    if (!prev || limit > prev.limit) pointLimit.set(p, { limit, verdict: prev ? combine([prev.verdict, v]) : v });
    else pointLimit.set(p, { limit: prev.limit, verdict: combine([prev.verdict, v]) });
  };

  if (checks.length === 0) {
    return { verdict: 'not_judged', checks: [], points: element.points.map((p) => pointResult(p, null, 'not_judged')), worstPoint: worstOf(element.points), reasons: [`${set.name} sets no level for this kind of element.`] };
  }

  for (const c of checks) {
    if (c.kind === 'response') {
      const t = c.share >= 1 ? element.response?.toFullS : element.response?.toHalfS;
      const what = c.share >= 1 ? 'the full required level' : `${Math.round(c.share * 100)} % of the required level`;
      const verdict: VerdictKind = t === null || t === undefined ? 'inconclusive' : t <= c.withinS ? 'meets' : 'falls_short';
      results.push({
        checkId: c.id, kind: c.kind, pass: 'initial', verdict, value: t ?? null, valueBound: null, uncertainty: null, limit: c.withinS, worstPoint: null, source: c.source, roundingNote: null,
        text: t === null || t === undefined ? `Time to ${what}: not recorded, so compliance is not shown (at most ${c.withinS} s).` : `Time to ${what}: ${t} s against at most ${c.withinS} s: ${verdict.replace('_', ' ')}.`,
      });
      continue;
    }
    if (c.kind === 'route_width') {
      const w = element.widthM ?? null;
      const verdict: VerdictKind = w === null ? 'inconclusive' : w <= c.maxWidthM ? 'meets' : 'inconclusive';
      results.push({
        checkId: c.id, kind: c.kind, pass: null, verdict, value: w, valueBound: null, uncertainty: null, limit: c.maxWidthM, worstPoint: null, source: c.source, roundingNote: null,
        text: w === null ? 'Route width not given.' : w <= c.maxWidthM ? `Route width ${w} m: within the ${c.maxWidthM} m the route rules are written for.` : `Route width ${w} m is over ${c.maxWidthM} m: survey it as ${c.maxWidthM} m strips or as an open area; compliance is not shown as a single route.`,
      });
      continue;
    }
    const passes: EmergencyPass[] = c.pass === 'each' ? (measuredPasses.length ? measuredPasses : ['end_of_duration']) : [c.pass];
    for (const pass of passes) {
      const pts = element.points.filter((p) => p.pass === pass && inScope(p.role, c.scope));
      const base = { checkId: c.id, kind: c.kind, pass, source: c.source, roundingNote: null as string | null };
      if (pts.length === 0) {
        results.push({ ...base, verdict: 'inconclusive', value: null, valueBound: null, uncertainty: null, limit: null, worstPoint: null, text: `No points measured for this check in the ${passName(pass)} pass: compliance is not shown.` });
        continue;
      }
      if (c.kind === 'min' || c.kind === 'share_of_normal') {
        let limit: number;
        let limitWords: string;
        if (c.kind === 'min') {
          limit = limitLux(c.limit);
          limitWords = limitText(c.limit);
        } else {
          const floor = limitLux(c.floor);
          if (element.normalEmLux === null || element.normalEmLux === undefined) {
            results.push({ ...base, verdict: 'inconclusive', value: null, valueBound: null, uncertainty: null, limit: null, worstPoint: null, text: 'The normal lighting\'s maintained illuminance is not given, so the required level cannot be set.' });
            continue;
          }
          limit = Math.max(c.share * element.normalEmLux, floor);
          limitWords = `max(${Math.round(c.share * 100)} % of ${fmtLux(element.normalEmLux)} lx, ${fmtLux(floor)} lx) = ${fmtLux(limit)} lx`;
        }
        const m = judgeMin(pts, limit, rule);
        for (const [p, v] of m.perPoint) notePoint(p, limit, v);
        const w = m.worst;
        const shown = w ? `${fmtLux(w.reading.lux as number)} lx${boundWord(w.reading.luxBound)} ± ${fmtLux(w.reading.uLux)} lx at ${w.label}` : 'no value';
        const failing = [...m.perPoint.values()].filter((v) => v === 'falls_short').length;
        let roundingNote: string | null = null;
        if (c.kind === 'min' && c.limit.unit === 'fc') {
          const alt = judgeMin(pts, printedLux(c.limit), rule).verdict;
          if (alt !== m.verdict) roundingNote = `Against the rounded ${printedLux(c.limit)} lx often printed for ${c.limit.value} fc this would be "${alt.replace('_', ' ')}"; Luxtrail judges against the exact ${limitLux(c.limit).toPrecision(5)} lx (1 fc = 10.763910417 lx).`;
        }
        results.push({
          ...base, verdict: m.verdict, value: w?.reading.lux ?? null, valueBound: w ? (w.reading.luxBound === 'exact' ? null : w.reading.luxBound) : 'indeterminate', uncertainty: w?.reading.uLux ?? null, limit, worstPoint: w?.label ?? null, roundingNote,
          text: `${scopeName(c.scope)} minimum ${shown} against at least ${limitWords}: ${m.verdict.replace('_', ' ')}${failing ? ` (${failing} of ${pts.length} points fall short)` : ''}.`,
        });
        continue;
      }
      if (c.kind === 'average') {
        const s = zoneStats(pts.map((p) => p.reading));
        const limit = limitLux(c.limit);
        const w = rule === 'guarded' ? s.uEavg : 0;
        const v: VerdictKind = s.eavg === null || w === null ? 'inconclusive' : judgeLowerLimit(s.eavg, s.bounded.eavg, w, limit);
        let roundingNote: string | null = null;
        if (c.limit.unit === 'fc' && s.eavg !== null && w !== null) {
          const alt = judgeLowerLimit(s.eavg, s.bounded.eavg, w, printedLux(c.limit));
          if (alt !== v) roundingNote = `Against the rounded ${printedLux(c.limit)} lx often printed for ${c.limit.value} fc this would be "${alt.replace('_', ' ')}"; Luxtrail judges against the exact ${limitLux(c.limit).toPrecision(5)} lx (1 fc = 10.763910417 lx).`;
        }
        results.push({
          ...base, verdict: v, value: s.eavg, valueBound: s.bounded.eavg, uncertainty: s.uEavg, limit, worstPoint: null, roundingNote,
          text: `${scopeName(c.scope)} average ${s.eavg === null ? 'not available' : `${fmtLux(s.eavg)} lx${boundWord(s.bounded.eavg)} ± ${fmtLux(s.uEavg ?? 0)} lx`} over ${pts.length} points against at least ${limitText(c.limit)}: ${v.replace('_', ' ')}.`,
        });
        continue;
      }
      // Ratios: Emax:Emin <= N is judged as Emin/Emax >= 1/N.
      const m = minOverMax(pts);
      const minRatio = c.kind === 'max_min_ratio' ? 1 / c.maxRatio : c.minRatio;
      const w = rule === 'guarded' ? m.u : 0;
      const v: VerdictKind = m.ratio === null || w === null ? 'inconclusive' : judgeLowerLimit(m.ratio, m.bound, w, minRatio);
      const worst = m.lo?.label ?? null;
      const text = c.kind === 'max_min_ratio'
        ? `${scopeName(c.scope)} Emax:Emin ${m.ratio === null ? 'not available' : ratioText(m.ratio)}${m.lo && m.hi ? ` (${fmtLux(m.hi.reading.lux as number)} lx at ${m.hi.label} over ${fmtLux(m.lo.reading.lux as number)} lx at ${m.lo.label})` : ''}${m.bound === 'lower' ? ' (at most this)' : m.bound === 'upper' ? ' (at least this)' : ''} against at most ${c.maxRatio}:1: ${v.replace('_', ' ')}.`
        : `${scopeName(c.scope)} Emin/Emax ${m.ratio === null ? 'not available' : `${m.ratio.toPrecision(3)}${m.u !== null && rule === 'guarded' ? ` ± ${m.u.toPrecision(2)}` : ''}`}${boundWord(m.bound)} against at least ${c.minRatio}: ${v.replace('_', ' ')}.`;
      results.push({ ...base, verdict: v, value: m.ratio, valueBound: m.bound, uncertainty: m.u, limit: minRatio, worstPoint: worst, text });
    }
  }

  const missing = set.requiredPasses.filter((p) => !measuredPasses.includes(p));
  for (const p of missing) reasons.push(`${set.name} asks for the ${passName(p)} pass, which has no readings for this element: compliance is not shown.`);
  let verdict = combine(results.map((r) => r.verdict));
  if (verdict === 'meets' && missing.length > 0) verdict = 'inconclusive';
  const borderPoints = element.points.filter((p) => p.role === 'border').length;
  if (borderPoints > 0) reasons.push(`${borderPoints} reading(s) in the 0.5 m border are shown but not judged.`);
  for (const r of results) if (r.verdict === 'falls_short') reasons.push(r.text);

  const points = element.points.map((p) => {
    const l = pointLimit.get(p);
    return pointResult(p, l?.limit ?? null, l?.verdict ?? 'not_judged');
  });
  return { verdict, checks: results, points, worstPoint: worstOf(element.points), reasons };
}

/**
 * A route wider than the set's route width, judged as routeStripCount equal strips side by side,
 * each as a route of its own (centre line, central band, ratio; points by their strip); the
 * response times once for the whole route. It meets only if every strip does.
 */
function judgeRouteStrips(element: EmergencyElementInput, set: EmergencyCriteriaSet, rule: AcceptanceRule, widthCheck: Extract<EmergencyCheck, { kind: 'route_width' }>): ElementResult {
  const width = element.widthM as number;
  const n = routeStripCount(width, widthCheck.maxWidthM);
  const stripWidth = width / n;
  const stripSet: EmergencyCriteriaSet = { ...set, checks: set.checks.filter((c) => c.kind !== 'response' && c.kind !== 'route_width') };
  const responseSet: EmergencyCriteriaSet = { ...set, requiredPasses: [], checks: set.checks.filter((c) => c.kind === 'response') };
  const checks: CheckResult[] = [{
    checkId: widthCheck.id, kind: 'route_width', pass: null, verdict: 'meets', value: width, valueBound: null, uncertainty: null, limit: widthCheck.maxWidthM, worstPoint: null, source: widthCheck.source, roundingNote: null,
    text: `Route width ${width} m is over ${widthCheck.maxWidthM} m: judged as ${n} strips of ${Number(stripWidth.toFixed(3))} m side by side, each as a route (strip 1 on the left looking along the route).`,
  }];
  const reasons: string[] = [];
  // Point results in the element's own order (callers pair them with their readings by index).
  const pointOf = new Map<EmergencyPoint, PointResult>();
  const verdicts: VerdictKind[] = [];
  for (let k = 1; k <= n; k++) {
    const mine = element.points.filter((p) => p.strip === k);
    const sub = judgeEmergencyElement({ ...element, widthM: stripWidth, response: null, points: mine }, stripSet, rule);
    checks.push(...sub.checks.map((c) => ({ ...c, checkId: `${c.checkId}/S${k}`, text: `Strip ${k} of ${n}: ${c.text}` })));
    reasons.push(...sub.reasons.map((r) => `Strip ${k} of ${n}: ${r}`));
    mine.forEach((p, i) => pointOf.set(p, sub.points[i]));
    verdicts.push(sub.verdict === 'not_judged' ? 'inconclusive' : sub.verdict);
  }
  const response = judgeEmergencyElement({ ...element, widthM: stripWidth, points: [] }, responseSet, rule);
  if (response.verdict !== 'not_judged') {
    checks.push(...response.checks);
    verdicts.push(response.verdict);
    reasons.push(...response.reasons);
  }
  const outside = element.points.filter((p) => !(typeof p.strip === 'number' && p.strip >= 1 && p.strip <= n));
  if (outside.length > 0) reasons.push(`${outside.length} reading(s) name no strip of this route, so they are shown but not judged: take wide routes' points from their strip labels or positions.`);
  for (const p of outside) pointOf.set(p, pointResult(p, null, 'not_judged'));
  return { verdict: combine(verdicts), checks, points: element.points.map((p) => pointOf.get(p) as PointResult), worstPoint: worstOf(element.points), reasons };
}

function pointResult(p: EmergencyPoint, limit: number | null, verdict: VerdictKind | 'not_judged'): PointResult {
  return { label: p.label, role: p.role, pass: p.pass, lux: p.reading.lux, luxBound: p.reading.luxBound, uLux: p.reading.uLux, flag: p.reading.flag, limitLux: limit, verdict };
}

function worstOf(points: readonly EmergencyPoint[]): ElementResult['worstPoint'] {
  let w: EmergencyPoint | null = null;
  for (const p of points) if (p.role !== 'border' && p.reading.lux !== null && (w === null || p.reading.lux < (w.reading.lux as number))) w = p;
  return w ? { label: w.label, pass: w.pass, lux: w.reading.lux as number, luxBound: w.reading.luxBound, uLux: w.reading.uLux } : null;
}

export function passName(p: EmergencyPass): string {
  return p === 'initial' ? 'initial (right after the mains failed)' : 'end-of-duration';
}

function scopeName(s: EmergencyScope): string {
  return { centre_line: 'Centre line', central_band: 'Central band', area: 'Area (less the border)', equipment: 'Equipment point', all: 'Path' }[s];
}

/** Overall verdict of several elements: falls short if any does, meets if all judged ones meet. */
export function combineElementVerdicts(verdicts: readonly (VerdictKind | 'not_judged')[]): VerdictKind | 'not_judged' {
  const judged = verdicts.filter((v): v is VerdictKind => v !== 'not_judged');
  return judged.length === 0 ? 'not_judged' : combine(judged);
}
