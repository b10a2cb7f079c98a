import { useState } from 'react';
import { GripVertical } from 'lucide-react';
import type { PlannedPoint, UnplacedResponse } from '@shared/schemas/planned-points';
import { useUnits } from '@/lib/units';
import { Button } from '@/components/ui/button';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { QueryState } from '@/components/ui/states';
import { useUnplaced } from '../api/get-unplaced';
import { usePlaceReading } from '../api/place-reading';

export const READING_DRAG_TYPE = 'application/x-luxtrail-reading';

type Reading = UnplacedResponse['groups'][number]['readings'][number];

/**
 * Readings without a place on a plan, by label with time and value. Each can be dragged onto the
 * plan, assigned to a planned point, or given x, y typed in (the keyboard route).
 */
export function UnplacedPanel({ surveyId, planId, timeZone, plannedPoints, editable, placeError }: {
  surveyId: number; planId: number; timeZone: string; plannedPoints: readonly PlannedPoint[]; editable: boolean; placeError?: unknown;
}) {
  const query = useUnplaced(surveyId);
  const [chosen, setChosen] = useState<Reading | null>(null);
  return (
    <Card data-testid="unplaced-panel">
      <CardHeader title="Readings without a place" description={editable ? 'Drag a reading onto the plan, or choose one and assign it to a planned point or type where it was taken.' : 'These readings have no position on any plan.'} />
      <CardBody className="space-y-3">
        <QueryState query={query} isEmpty={(d) => d.total === 0} empty={<p className="text-sm text-ink-600">Every reading has a place on a plan.</p>}>
          {(d) => (
            <>
              <p className="text-sm text-ink-700">{d.total} reading(s){d.total > d.groups.reduce((n, g) => n + g.readings.length, 0) ? ' (the first 2,000 are listed)' : ''}.</p>
              <ul className="max-h-80 space-y-2 overflow-y-auto pr-1" aria-label="Readings without a place, by label">
                {d.groups.map((g) => (
                  <li key={g.point}>
                    <p className="text-xs font-semibold uppercase tracking-wide text-ink-500">{g.point}</p>
                    <ul className="mt-1 space-y-1">
                      {g.readings.map((r) => <UnplacedRow key={r.id} reading={r} timeZone={timeZone} editable={editable} chosen={chosen?.id === r.id} onChoose={() => setChosen(r)} />)}
                    </ul>
                  </li>
                ))}
              </ul>
            </>
          )}
        </QueryState>
        {editable && chosen && <PlaceForm key={chosen.id} surveyId={surveyId} planId={planId} reading={chosen} plannedPoints={plannedPoints} onDone={() => setChosen(null)} />}
        <FormError error={placeError} />
      </CardBody>
    </Card>
  );
}

function UnplacedRow({ reading, timeZone, editable, chosen, onChoose }: { reading: Reading; timeZone: string; editable: boolean; chosen: boolean; onChoose: () => void }) {
  const { format } = useUnits();
  const time = new Intl.DateTimeFormat('en-GB', { timeZone, dateStyle: 'medium', timeStyle: 'medium' }).format(new Date(reading.timestamp));
  const value = reading.lux === null ? 'no value' : format(reading.lux, { bound: reading.luxBound });
  return (
    <li
      draggable={editable}
      onDragStart={(e) => { e.dataTransfer.setData(READING_DRAG_TYPE, String(reading.id)); e.dataTransfer.effectAllowed = 'move'; }}
      className={`flex items-center gap-2 rounded-lg px-2 py-1 text-sm ring-1 ${chosen ? 'bg-lamp-50 ring-lamp-300' : 'ring-ink-100'}`}
      data-testid="unplaced-reading"
      data-reading-id={reading.id}
    >
      {editable && <GripVertical className="h-4 w-4 shrink-0 cursor-grab text-ink-400" aria-hidden />}
      <span className="num min-w-0 flex-1">{time} · {value} · {reading.probe}</span>
      {editable && <Button size="sm" variant="ghost" onClick={onChoose} aria-pressed={chosen}>Place…</Button>}
    </li>
  );
}

function PlaceForm({ surveyId, planId, reading, plannedPoints, onDone }: { surveyId: number; planId: number; reading: Reading; plannedPoints: readonly PlannedPoint[]; onDone: () => void }) {
  const place = usePlaceReading();
  const [pointId, setPointId] = useState<number | ''>('');
  const [x, setX] = useState('');
  const [y, setY] = useState('');
  const num = (v: string) => Number(v.replace(',', '.'));
  const sorted = [...plannedPoints].sort((a, b) => a.label.localeCompare(b.label, undefined, { numeric: true }));
  return (
    <div className="space-y-3 rounded-lg bg-ink-50 p-3" aria-label={`Place reading ${reading.point}`}>
      <p className="text-sm font-medium">Place {reading.point}</p>
      <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); if (pointId !== '') place.mutate({ surveyId, readingId: reading.id, body: { plannedPointId: pointId } }, { onSuccess: onDone }); }}>
        <SelectField label="On planned point" value={pointId} onChange={(e) => setPointId(e.target.value ? Number(e.target.value) : '')} className="min-w-0 flex-1">
          <option value="">Choose a planned point</option>
          {sorted.map((p) => <option key={p.id} value={p.id}>{p.label}{p.readingCount > 0 ? ` · ${p.readingCount} reading(s)` : ''}</option>)}
        </SelectField>
        <Button type="submit" size="sm" disabled={pointId === ''} busy={place.isPending}>Assign</Button>
      </form>
      <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); place.mutate({ surveyId, readingId: reading.id, body: { planId, xM: num(x), yM: num(y) } }, { onSuccess: onDone }); }}>
        <TextField label="x (m)" inputMode="decimal" value={x} onChange={(e) => setX(e.target.value)} className="w-24" />
        <TextField label="y (m)" inputMode="decimal" value={y} onChange={(e) => setY(e.target.value)} className="w-24" />
        <Button type="submit" size="sm" variant="secondary" busy={place.isPending}>Place on this plan</Button>
      </form>
      <FormError error={place.error} />
    </div>
  );
}
