// Placing a label-free log by time: each burst of a logging meter goes to the "measured here now"
// mark nearest in time within a window. Nothing is guessed: a burst two marks could claim, or
// one whose mark already took a nearer burst, stays unplaced with the reason.

/** Default matching window, either side of a mark (project's own choice). */
export const DEFAULT_MATCH_WINDOW_MS = 20_000;

export interface MatchBurst {
  id: number;
  /** The meter's own clock, epoch ms. */
  timeMs: number;
  probe: string;
}

export interface MatchMark {
  id: number;
  /** The phone's clock, epoch ms. */
  timeMs: number;
  /** The probe the mark names; null: any probe. */
  probe: string | null;
}

export interface MatchOptions {
  windowMs?: number;
  /** Added to every burst's time to bring the meter's clock onto the phone's (ms). */
  clockOffsetMs?: number;
}

export type UnplacedReason = 'no_mark' | 'ambiguous' | 'mark_taken';

export interface MarkMatching {
  matched: { burstId: number; markId: number; deltaMs: number }[];
  unplaced: { burstId: number; reason: UnplacedReason; markIds: number[]; message: string }[];
  /** Marks no burst was placed on. */
  marksWithoutBurst: number[];
  windowMs: number;
  clockOffsetMs: number;
}

/** The offset that makes one burst fall exactly on one mark (align a known mark): mark - burst. */
export function clockOffsetFromAlignment(markTimeMs: number, burstTimeMs: number): number {
  return markTimeMs - burstTimeMs;
}

export function matchBurstsToMarks(bursts: readonly MatchBurst[], marks: readonly MatchMark[], options: MatchOptions = {}): MarkMatching {
  const windowMs = options.windowMs ?? DEFAULT_MATCH_WINDOW_MS;
  const clockOffsetMs = options.clockOffsetMs ?? 0;
  if (!(windowMs >= 0) || !Number.isFinite(windowMs)) throw new RangeError(`window must be a number of at least 0 ms (got ${windowMs})`);
  if (!Number.isFinite(clockOffsetMs)) throw new RangeError(`clock offset must be a number (got ${clockOffsetMs})`);
  const sec = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

  // Step 1: each burst's candidates (same probe where the mark names one, within the window).
  const claims = new Map<number, { burst: MatchBurst; delta: number }[]>();
  const unplaced: MarkMatching['unplaced'] = [];
  for (const b of bursts) {
    const t = b.timeMs + clockOffsetMs;
    const candidates = marks.filter((m) => (m.probe === null || m.probe === b.probe) && Math.abs(t - m.timeMs) <= windowMs);
    if (candidates.length === 0) {
      unplaced.push({ burstId: b.id, reason: 'no_mark', markIds: [], message: `No mark within ±${sec(windowMs)} of this burst` });
      continue;
    }
    if (candidates.length > 1) {
      unplaced.push({ burstId: b.id, reason: 'ambiguous', markIds: candidates.map((m) => m.id), message: `${candidates.length} marks lie within ±${sec(windowMs)}; Luxtrail does not guess between them` });
      continue;
    }
    const m = candidates[0];
    const list = claims.get(m.id) ?? [];
    list.push({ burst: b, delta: t - m.timeMs });
    claims.set(m.id, list);
  }

  // Step 2: a mark takes its one nearest burst; a tie or any further burst is left unplaced.
  const matched: MarkMatching['matched'] = [];
  for (const [markId, list] of claims) {
    list.sort((a, b) => Math.abs(a.delta) - Math.abs(b.delta));
    const tie = list.length > 1 && Math.abs(list[0].delta) === Math.abs(list[1].delta);
    list.forEach((c, i) => {
      if (i === 0 && !tie) matched.push({ burstId: c.burst.id, markId, deltaMs: c.delta });
      else unplaced.push({
        burstId: c.burst.id, reason: tie ? 'ambiguous' : 'mark_taken', markIds: [markId],
        message: tie ? 'Two bursts lie equally near the same mark; Luxtrail does not guess between them' : `Its mark already took a burst ${sec(Math.abs(list[0].delta))} away`,
      });
    });
  }
  const used = new Set(matched.map((m) => m.markId));
  matched.sort((a, b) => a.burstId - b.burstId);
  unplaced.sort((a, b) => a.burstId - b.burstId);
  return { matched, unplaced, marksWithoutBurst: marks.filter((m) => !used.has(m.id)).map((m) => m.id), windowMs, clockOffsetMs };
}
