import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import type { JudgeReading, JudgeZone } from './judge-zones';

/** A pause of this long or longer between task readings starts a new walk (project's own choice). */
export const WALK_BREAK_MS = 30 * 60_000;

export type PlanZones = { planId: number; planName: string; zones: JudgeZone[] };

/**
 * Which plan each task reading was taken on. Every plan of a site has its own frame from its
 * lower-left corner, and a log gives only x_m, y_m, so floors overlap in coordinates. Until a log
 * names its plan, readings are attributed walk by walk: a surveyor walks one plan in one go, a
 * pause of WALK_BREAK_MS or more starts a new walk, and each walk goes to the plan whose zones
 * contain most of its points (the earlier plan on a tie). With one plan there is nothing to decide.
 */
export function attributeToPlans(readings: readonly JudgeReading[], plans: readonly PlanZones[]): { byPlan: Map<number, JudgeReading[]>; note: string | null } {
  const byPlan = new Map<number, JudgeReading[]>(plans.map((p) => [p.planId, []]));
  const task = readings.filter((r) => r.role === 'task').sort((a, b) => a.timeMs - b.timeMs || a.id - b.id);
  if (plans.length === 0) return { byPlan, note: null };
  if (plans.length === 1 || task.length === 0) {
    if (task.length) byPlan.set(plans[0].planId, task);
    return { byPlan, note: null };
  }
  const assigners = plans.map((p) => ({ planId: p.planId, assign: createZoneAssigner(p.zones.map((z) => ({ id: z.id, kind: z.kind, wallBandM: z.wallBandM, polygon: z.polygon }))) }));
  const walks: JudgeReading[][] = [];
  for (const r of task) {
    const last = walks[walks.length - 1];
    if (!last || r.timeMs - last[last.length - 1].timeMs >= WALK_BREAK_MS) walks.push([r]);
    else last.push(r);
  }
  const used = new Set<number>();
  for (const walk of walks) {
    const placed = walk.filter((r) => r.xM !== null && r.yM !== null);
    let best = assigners[0].planId;
    let bestCount = -1;
    for (const a of assigners) {
      const count = placed.filter((r) => a.assign([r.xM as number, r.yM as number]).zoneId !== null).length;
      if (count > bestCount) { best = a.planId; bestCount = count; }
    }
    byPlan.get(best)!.push(...walk);
    used.add(best);
  }
  const names = plans.filter((p) => used.has(p.planId)).map((p) => p.planName);
  return {
    byPlan,
    note: `This site has ${plans.length} plans and the logs do not say which plan a reading was taken on: the ${walks.length} walk(s) of this survey `
      + `(a pause of ${WALK_BREAK_MS / 60_000} min or more starts a new one) were each put on the plan whose zones hold most of their points (${names.join(', ')}).`,
  };
}
