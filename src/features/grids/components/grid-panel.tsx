import { useMemo, useState } from 'react';
import { Download, FileText } from 'lucide-react';
import type { Zone } from '@shared/schemas/zones';
import { GRID_LAYOUT_LABELS, GRID_ROUNDING_LABELS, GRID_SURFACE_LABELS, type PlannedPoint, type PlannedPointsResponse, type SurveyGrid } from '@shared/schemas/planned-points';
import { isNarrowZone, NARROW_ZONE_WIDTH_M, WALL_HEIGHT_RANGE_M, type GridLayout, type GridRounding, type GridSurface } from '@shared/spatial/measurement-grid';
import { Button } from '@/components/ui/button';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { Badge } from '@/components/ui/badge';
import { FormError } from '@/components/ui/form-error';
import { useCreatePlannedPoint, useDeletePlannedPoint, useGenerateGrid, useJustifyGrid, useMovePlannedPoint } from '../api/edit-planned-points';
import { apiFiles } from '@shared/paths';

type Props = {
  surveyId: number;
  planId: number;
  zones: readonly Zone[];
  data: PlannedPointsResponse;
  editable: boolean;
  selected: PlannedPoint | null;
  onSelect: (p: PlannedPoint | null) => void;
  /** The reason typed for grid changes, shared with dragging on the map. */
  reason: string;
  onReason: (r: string) => void;
};

const fmtM = (v: number) => v.toFixed(2);

/** Generating a zone's or a plan's grid, its counts and reason, and editing planned points with the keyboard. */
export function GridPanel({ surveyId, planId, zones, data, editable, selected, onSelect, reason, onReason }: Props) {
  const [zoneId, setZoneId] = useState<number | ''>(zones[0]?.id ?? '');
  const [rounding, setRounding] = useState<GridRounding>(data.rounding);
  const [layout, setLayout] = useState<GridLayout>('full');
  const [surface, setSurface] = useState<GridSurface>('working_plane');
  const [roomHeight, setRoomHeight] = useState('3');
  const generate = useGenerateGrid();
  const zone = zones.find((z) => z.id === zoneId);
  const narrow = zone ? isNarrowZone(zone.polygon) : false;
  const onPlane = surface === 'working_plane';
  const wallHeightM = surface === 'walls' ? Number(roomHeight.replace(',', '.')) : undefined;
  const surfaceFields = { surface, ...(wallHeightM !== undefined ? { wallHeightM } : {}) };
  const gridsHere = data.grids.filter((g) => g.planId === planId);
  const pointsHere = data.items.filter((p) => p.planId === planId);

  return (
    <Card>
      <CardHeader title="Planned points" description={`${pointsHere.length} planned on this plan, ${pointsHere.filter((p) => p.readingCount > 0).length} with a reading. ${data.roundingText}.`} />
      <CardBody className="space-y-4">
        {data.items.length > 0 && <div className="flex flex-wrap gap-2">
          <a className="inline-flex items-center gap-2 rounded-lg bg-white px-2.5 py-1.5 text-sm font-medium ring-1 ring-inset ring-ink-200 hover:bg-ink-50" href={apiFiles.walkSheetPdf(surveyId)} download data-testid="walk-sheet-link">
            <FileText className="h-4 w-4" aria-hidden />Walk sheet (PDF)
          </a>
          <a className="inline-flex items-center gap-2 rounded-lg bg-white px-2.5 py-1.5 text-sm font-medium ring-1 ring-inset ring-ink-200 hover:bg-ink-50" href={apiFiles.plannedPointsCsv(surveyId)} download>
            <Download className="h-4 w-4" aria-hidden />Planned points (CSV)
          </a>
        </div>}
        {editable && (
          <form
            className="grid gap-3 sm:grid-cols-2"
            onSubmit={(e) => { e.preventDefault(); if (zoneId !== '') generate.mutate({ surveyId, zoneId, rounding, layout: narrow && onPlane ? layout : 'full', ...surfaceFields }); }}
          >
            <SelectField label="Zone" value={zoneId} onChange={(e) => setZoneId(e.target.value ? Number(e.target.value) : '')}>
              {zones.map((z) => <option key={z.id} value={z.id}>{z.name}</option>)}
            </SelectField>
            <SelectField label="Points per side" value={rounding} onChange={(e) => setRounding(e.target.value as GridRounding)} hint={rounding !== data.rounding ? 'Generating with this rounding changes the survey\'s rule for every zone.' : undefined}>
              {(Object.keys(GRID_ROUNDING_LABELS) as GridRounding[]).map((r) => <option key={r} value={r}>{GRID_ROUNDING_LABELS[r]}</option>)}
            </SelectField>
            <SelectField label="Surface" value={surface} onChange={(e) => setSurface(e.target.value as GridSurface)}
              hint={onPlane ? 'Walls and ceilings of rooms can be gridded too (EN 12464-1:2021 asks for their illuminance).' : 'Planned for rooms only; the rule for this surface is Luxtrail\'s own, stated on the walk sheet.'}>
              {(Object.keys(GRID_SURFACE_LABELS) as GridSurface[]).map((k) => <option key={k} value={k}>{GRID_SURFACE_LABELS[k]}</option>)}
            </SelectField>
            {surface === 'walls' ? (
              <TextField label="Room height (m)" inputMode="decimal" value={roomHeight} onChange={(e) => setRoomHeight(e.target.value)}
                hint={`Floor to ceiling, ${WALL_HEIGHT_RANGE_M.min} m to ${WALL_HEIGHT_RANGE_M.max} m: each wall is gridded over its length and this height.`} />
            ) : (
              <SelectField label="Layout" value={narrow && onPlane ? layout : 'full'} onChange={(e) => setLayout(e.target.value as GridLayout)} disabled={!narrow || !onPlane}
                hint={narrow && onPlane ? 'A centreline row is the documented alternative for this narrow zone.' : `A centreline row is offered for the working plane of zones narrower than ${NARROW_ZONE_WIDTH_M} m.`}>
                {(Object.keys(GRID_LAYOUT_LABELS) as GridLayout[]).map((l) => <option key={l} value={l}>{GRID_LAYOUT_LABELS[l]}</option>)}
              </SelectField>
            )}
            <div className="flex flex-wrap items-end gap-2">
              <Button type="submit" busy={generate.isPending && generate.variables?.zoneId !== undefined} disabled={zoneId === ''}>Generate grid for zone</Button>
              <Button type="button" variant="secondary" busy={generate.isPending && generate.variables?.planId !== undefined} onClick={() => generate.mutate({ surveyId, planId, rounding, ...surfaceFields })}>{onPlane ? 'Every zone of this plan' : 'Every room of this plan'}</Button>
            </div>
            <div className="sm:col-span-2"><FormError error={generate.error} /></div>
          </form>
        )}
        {gridsHere.length === 0
          ? <p className="text-sm text-ink-600">No grid planned on this plan yet.{editable ? ' Choose a zone and generate its grid.' : ''}</p>
          : <ul className="space-y-3">{gridsHere.map((g) => <GridSummary key={g.id} surveyId={surveyId} grid={g} editable={editable} />)}</ul>}
        {editable && gridsHere.length > 0 && (
          <PointEditor surveyId={surveyId} points={pointsHere} grids={gridsHere} selected={selected} onSelect={onSelect} reason={reason} onReason={onReason} />
        )}
      </CardBody>
    </Card>
  );
}

function GridSummary({ surveyId, grid, editable }: { surveyId: number; grid: SurveyGrid; editable: boolean }) {
  const [text, setText] = useState(grid.reason ?? '');
  const justify = useJustifyGrid();
  return (
    <li className="rounded-lg p-3 ring-1 ring-ink-200" data-testid={`grid-${grid.code}`}>
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-medium">{grid.zoneName}</span>
        <Badge tone="neutral">{grid.code}</Badge>
        {grid.surface !== 'working_plane' && <Badge tone="info">{GRID_SURFACE_LABELS[grid.surface]}{grid.wallHeightM !== null ? `, ${fmtM(grid.wallHeightM)} m high` : ''}</Badge>}
        <span className="text-sm text-ink-700">{grid.pointCount} point(s){grid.changed ? ` (generated ${grid.generatedCount})` : ''}, p = {fmtM(grid.spacingM)} m from d = {fmtM(grid.dM)} m</span>
        {grid.layout === 'centreline' && <Badge tone="info">Centreline row</Badge>}
        {grid.changed && <Badge tone={grid.reason ? 'warn' : 'bad'}>{grid.reason ? 'Changed grid' : 'Changed, no reason'}</Badge>}
      </div>
      {grid.roundingsDiffer && <p className="mt-1 text-xs text-ink-600">The two readings of the rule differ here: {grid.countsByRounding.next_higher} points (next higher) or {grid.countsByRounding.nearest} (nearest).</p>}
      {grid.surface === 'walls' && (
        <ul className="mt-1 space-y-0.5 text-xs text-ink-600">{grid.notes.filter((n) => n.startsWith('Wall ')).map((n) => <li key={n}>{n}</li>)}</ul>
      )}
      {grid.reason && <p className="mt-1 text-sm text-ink-700">Reason: {grid.reason}</p>}
      {editable && grid.changed && (
        <form className="mt-2 flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); justify.mutate({ surveyId, gridId: grid.id, reason: text }); }}>
          <TextField label="Reason for the changed grid" value={text} onChange={(e) => setText(e.target.value)} className="min-w-0 flex-1" />
          <Button type="submit" size="sm" variant="secondary" busy={justify.isPending}>Save reason</Button>
          <div className="w-full"><FormError error={justify.error} /></div>
        </form>
      )}
    </li>
  );
}

/** Keyboard route to every edit that dragging does on the map: choose a point, type its place, or delete it; add a point. */
function PointEditor({ surveyId, points, grids, selected, onSelect, reason, onReason }: {
  surveyId: number; points: PlannedPoint[]; grids: SurveyGrid[]; selected: PlannedPoint | null; onSelect: (p: PlannedPoint | null) => void; reason: string; onReason: (r: string) => void;
}) {
  const sorted = useMemo(() => [...points].sort((a, b) => a.label.localeCompare(b.label, undefined, { numeric: true })), [points]);
  const [x, setX] = useState('');
  const [y, setY] = useState('');
  const [addZone, setAddZone] = useState<number>(grids.find((g) => g.surface === 'working_plane')?.zoneId ?? 0);
  const move = useMovePlannedPoint();
  const del = useDeletePlannedPoint();
  const add = useCreatePlannedPoint();
  const r = reason.trim() || undefined;
  const num = (v: string) => Number(v.replace(',', '.'));
  return (
    <div className="space-y-3 border-t border-ink-100 pt-3">
      <TextField label="Reason for changing the grid" value={reason} onChange={(e) => onReason(e.target.value)} hint="Needed once a zone's grid differs from the generated one (kept in the audit trail and printed with the verdict)." />
      <div className="grid gap-3 sm:grid-cols-[1fr_6rem_6rem]">
        <SelectField label="Planned point" value={selected?.id ?? ''} onChange={(e) => { const p = points.find((q) => q.id === Number(e.target.value)) ?? null; onSelect(p); if (p) { setX(fmtM(p.xM)); setY(fmtM(p.yM)); } }}>
          <option value="">Choose a point (or click one on the plan)</option>
          {sorted.map((p) => <option key={p.id} value={p.id}>{p.label}{p.plane !== 'horizontal' ? ` (${p.plane})` : ''}{p.readingCount > 0 ? ` · ${p.readingCount} reading(s)` : ' · not visited'}</option>)}
        </SelectField>
        <TextField label="x (m)" inputMode="decimal" value={x} onChange={(e) => setX(e.target.value)} />
        <TextField label="y (m)" inputMode="decimal" value={y} onChange={(e) => setY(e.target.value)} />
      </div>
      <div className="flex flex-wrap gap-2">
        <Button size="sm" variant="secondary" disabled={!selected} busy={move.isPending} onClick={() => selected && move.mutate({ surveyId, pointId: selected.id, xM: num(x), yM: num(y), reason: r })}>Move point here</Button>
        <Button size="sm" variant="danger" disabled={!selected} busy={del.isPending} onClick={() => selected && del.mutate({ surveyId, pointId: selected.id, reason: r }, { onSuccess: () => onSelect(null) })}>Delete point</Button>
      </div>
      <div className="flex flex-wrap items-end gap-2">
        <SelectField label="Add a point to" value={addZone} onChange={(e) => setAddZone(Number(e.target.value))} className="min-w-0 flex-1">
          {grids.filter((g) => g.surface === 'working_plane').map((g) => <option key={g.zoneId} value={g.zoneId}>{g.zoneName}</option>)}
        </SelectField>
        <Button size="sm" variant="secondary" busy={add.isPending} onClick={() => add.mutate({ surveyId, zoneId: addZone, xM: num(x), yM: num(y), reason: r })}>Add at x, y</Button>
      </div>
      <FormError error={move.error ?? del.error ?? add.error} />
    </div>
  );
}
