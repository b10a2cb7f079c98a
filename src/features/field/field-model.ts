// What the field view shows, worked out from the survey's state and the phone's outbox: every
// point with its state (to do, measured, skipped), the next point, and progress per zone.
import type { FieldRecord, FieldState } from '@shared/schemas/field';
import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import type { OutboxItem } from './offline/field-db';

export type PointState = 'todo' | 'measured' | 'skipped';
export type SyncState = 'synced' | 'waiting' | 'refused';

export type FieldEntry = {
  key: string;
  kind: 'typed' | 'mark' | 'skip';
  point: string;
  plannedPointId: number | null;
  planId: number | null;
  xM: number | null;
  yM: number | null;
  recordedAt: string;
  sync: SyncState;
  reason: string | null;
  /** Typed: the values as typed and their unit; the server's reading once synced. */
  values: number[] | null;
  unit: 'lx' | 'fc' | null;
  lights: 'on' | 'off' | null;
  skipReason: string | null;
  reading: FieldRecord['reading'];
  warnings: FieldRecord['warnings'];
};

export type FieldPoint = {
  /** Planned point id, or the label for a point recorded without a plan entry. */
  id: string;
  label: string;
  plannedPointId: number | null;
  planId: number | null;
  zoneId: number | null;
  xM: number | null;
  yM: number | null;
  state: PointState;
  entries: FieldEntry[];
};

/** The server's records and the phone's waiting or refused ones, oldest first; a key never twice. */
export function fieldEntries(state: FieldState | null, outbox: readonly OutboxItem[]): FieldEntry[] {
  const out: FieldEntry[] = [];
  const seen = new Set<string>();
  for (const r of state?.records ?? []) {
    seen.add(r.idempotencyKey);
    if (r.kind === 'zone_note') continue;
    out.push({
      key: r.idempotencyKey, kind: r.kind, point: r.point, plannedPointId: r.plannedPointId, planId: r.planId, xM: r.xM, yM: r.yM, recordedAt: r.recordedAt,
      sync: 'synced', reason: null, values: r.values, unit: r.unit, lights: r.lights, skipReason: r.reason, reading: r.reading, warnings: r.warnings,
    });
  }
  for (const item of outbox) {
    if (item.kind !== 'record' || item.body.kind === 'zone_note' || seen.has(item.key)) continue;
    const b = item.body;
    out.push({
      key: item.key, kind: b.kind, point: b.point, plannedPointId: b.plannedPointId ?? null, planId: b.planId ?? null, xM: b.xM ?? null, yM: b.yM ?? null,
      recordedAt: b.recordedAt, sync: item.state, reason: item.reason, values: b.kind === 'typed' ? b.values : null, unit: b.kind === 'typed' ? b.unit : null,
      lights: b.kind === 'typed' ? b.lights ?? null : null, skipReason: b.kind === 'skip' ? b.reason : null, reading: null, warnings: [],
    });
  }
  return out.sort((a, b) => a.recordedAt.localeCompare(b.recordedAt));
}

/** Every planned point, then every other point recorded; the latest entry that is not refused sets the state. */
export function fieldPoints(state: FieldState | null, entries: readonly FieldEntry[]): FieldPoint[] {
  if (!state) return [];
  const assign = new Map(state.plans.map((p) => [p.id, createZoneAssigner(state.zones.filter((z) => z.planId === p.id).map((z) => ({ id: z.id, kind: z.kind as 'room', wallBandM: 0, polygon: z.polygon })))]));
  const points = new Map<string, FieldPoint>();
  for (const p of state.plannedPoints) {
    points.set(`pp:${p.id}`, { id: `pp:${p.id}`, label: p.label, plannedPointId: p.id, planId: p.planId, zoneId: p.zoneId, xM: p.xM, yM: p.yM, state: 'todo', entries: [] });
  }
  const byLabel = new Map([...points.values()].map((p) => [p.label.trim().toLowerCase(), p]));
  for (const e of entries) {
    let p = e.plannedPointId !== null ? points.get(`pp:${e.plannedPointId}`) : byLabel.get(e.point.trim().toLowerCase());
    if (!p) {
      const zoneId = e.planId !== null && e.xM !== null && e.yM !== null ? assign.get(e.planId)?.([e.xM, e.yM]).zoneId ?? null : null;
      p = { id: `label:${e.point}`, label: e.point, plannedPointId: null, planId: e.planId, zoneId, xM: e.xM, yM: e.yM, state: 'todo', entries: [] };
      points.set(p.id, p);
      byLabel.set(e.point.trim().toLowerCase(), p);
    }
    p.entries.push(e);
    if (e.sync !== 'refused') p.state = e.kind === 'skip' ? 'skipped' : 'measured';
  }
  return [...points.values()];
}

/**
 * The next point: the to-do point nearest the last point recorded on the same plan, else the
 * first to-do point in planned order.
 */
export function nextPoint(points: readonly FieldPoint[], entries: readonly FieldEntry[]): FieldPoint | null {
  const todo = points.filter((p) => p.state === 'todo' && p.plannedPointId !== null);
  if (todo.length === 0) return null;
  const last = [...entries].reverse().find((e) => e.sync !== 'refused' && e.xM !== null && e.yM !== null);
  if (last) {
    const near = todo.filter((p) => p.planId === last.planId && p.xM !== null && p.yM !== null)
      .sort((a, b) => Math.hypot(a.xM! - last.xM!, a.yM! - last.yM!) - Math.hypot(b.xM! - last.xM!, b.yM! - last.yM!));
    if (near.length) return near[0];
  }
  return todo[0];
}

export type ZoneProgress = { zoneId: number; name: string; planId: number; done: number; total: number; skipped: number };

/** n of m per zone: points measured or skipped over the zone's points. */
export function zoneProgress(state: FieldState | null, points: readonly FieldPoint[]): ZoneProgress[] {
  if (!state) return [];
  return state.zones.map((z) => {
    const mine = points.filter((p) => p.zoneId === z.id);
    return { zoneId: z.id, name: z.name, planId: z.planId, total: mine.length, done: mine.filter((p) => p.state !== 'todo').length, skipped: mine.filter((p) => p.state === 'skipped').length };
  }).filter((z) => z.total > 0);
}

/** A note or photo on a whole zone, from the server or waiting on the phone. */
export type ZoneItem = { key: string; kind: 'note' | 'photo'; note: string | null; at: string; sync: SyncState; reason: string | null; url: string | null };

/** The zone's own notes and photos (not those of its points), oldest first; a key never twice. */
export function zoneItems(state: FieldState | null, outbox: readonly OutboxItem[], zoneId: number): ZoneItem[] {
  const out: ZoneItem[] = [];
  const seen = new Set<string>();
  for (const r of state?.records ?? []) {
    if (r.kind !== 'zone_note' || r.zoneId !== zoneId) continue;
    seen.add(r.idempotencyKey);
    out.push({ key: r.idempotencyKey, kind: 'note', note: r.note, at: r.recordedAt, sync: 'synced', reason: null, url: null });
  }
  for (const p of state?.photos ?? []) {
    if (p.zoneId !== zoneId || p.plannedPointId !== null || p.point !== null) continue;
    seen.add(p.idempotencyKey);
    out.push({ key: p.idempotencyKey, kind: 'photo', note: p.note, at: p.takenAt, sync: 'synced', reason: null, url: p.url });
  }
  for (const item of outbox) {
    if (seen.has(item.key)) continue;
    if (item.kind === 'record' && item.body.kind === 'zone_note' && item.body.zoneId === zoneId) {
      out.push({ key: item.key, kind: 'note', note: item.body.note, at: item.body.recordedAt, sync: item.state, reason: item.reason, url: null });
    } else if (item.kind === 'photo' && item.body.zoneId === zoneId && !item.body.point && !item.body.plannedPointId) {
      out.push({ key: item.key, kind: 'photo', note: item.body.note ?? null, at: item.body.takenAt, sync: item.state, reason: item.reason, url: null });
    }
  }
  return out.sort((a, b) => a.at.localeCompare(b.at));
}
