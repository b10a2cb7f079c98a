import { useState } from 'react';
import { GripVertical } from 'lucide-react';
import type { PlannedPoint, UnplacedResponse } from '@shared/schemas/planned-points';
import { formatDateTime } from '@shared/datetime';
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

type PlanChoice = { id: number; name: string };

/**
 * Readings without a place on a plan, by label with time and value. Each can be dragged onto the
 * plan shown beside it (`droppable`), assigned to a planned point, or given x, y typed in on one of
 * `plans` (the keyboard route).
 */
export function UnplacedPanel({ surveyId, plans, timeZone, plannedPoints, editable, droppable = true, placeError }: {
  surveyId: number;
  /** The plans a typed x, y may refer to: the one shown on the page, or the site's plans to choose from. */
  plans: readonly PlanChoice[];
  timeZone: string; plannedPoints: readonly PlannedPoint[]; editable: boolean;
  /** A plan is shown beside the panel that takes dropped readings. */
  droppable?: boolean;
  placeError?: unknown;
}) {
  const query = useUnplaced(surveyId);
  const [chosen, setChosen] = useState<Reading | null>(null);
  const how = droppable ? 'Drag a reading onto the plan, or choose one and assign it to a planned point or type where it was taken.' : 'Choose a reading and assign it to a planned point or type where it was taken.';
  return (
    <Card data-testid="unplaced-panel">
      <CardHeader title="Readings without a place" description={editable ? how : 'These readings have no position on any plan.'} />
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
                      {g.readings.map((r) => <UnplacedRow key={r.id} reading={r} timeZone={timeZone} editable={editable} draggable={editable && droppable} chosen={chosen?.id === r.id} onChoose={() => setChosen(r)} />)}
                    </ul>
                  </li>
                ))}
              </ul>
            </>
          )}
        </QueryState>
        {editable && chosen && <PlaceForm key={chosen.id} surveyId={surveyId} plans={plans} reading={chosen} plannedPoints={plannedPoints} onDone={() => setChosen(null)} />}
        <FormError error={placeError} />
      </CardBody>
    </Card>
  );
}

function UnplacedRow({ reading, timeZone, editable, draggable, chosen, onChoose }: { reading: Reading; timeZone: string; editable: boolean; draggable: boolean; chosen: boolean; onChoose: () => void }) {
  const { format } = useUnits();
  const time = formatDateTime(reading.timestamp, timeZone, { seconds: true });
  const value = reading.lux === null ? 'no value' : format(reading.lux, { bound: reading.luxBound });
  return (
    <li
      draggable={draggable}
      onDragStart={(e) => { e.dataTransfer.setData(READING_DRAG_TYPE, String(reading.id)); e.dataTransfer.effectAllowed = 'move'; }}
      className={`flex items-center gap-2 rounded-lg px-2 py-1 text-sm ring-1 ${chosen ? 'bg-lamp-50 ring-lamp-300' : 'ring-ink-100'}`}
      data-testid="unplaced-reading"
      data-reading-id={reading.id}
    >
      {draggable && <GripVertical className="h-4 w-4 shrink-0 cursor-grab text-ink-400" aria-hidden />}
      <span className="num min-w-0 flex-1 break-words">{time} · {value} · {reading.probe}</span>
      {editable && <Button size="sm" variant="ghost" onClick={onChoose} aria-pressed={chosen}>Place…</Button>}
    </li>
  );
}

function PlaceForm({ surveyId, plans, reading, plannedPoints, onDone }: { surveyId: number; plans: readonly PlanChoice[]; reading: Reading; plannedPoints: readonly PlannedPoint[]; onDone: () => void }) {
  const place = usePlaceReading();
  const [pointId, setPointId] = useState<number | ''>('');
  const [planId, setPlanId] = useState<number | ''>(plans[0]?.id ?? '');
  const planName = new Map(plans.map((p) => [p.id, p.name]));
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
          {sorted.map((p) => <option key={p.id} value={p.id}>{p.label}{plans.length > 1 && planName.has(p.planId) ? ` · ${planName.get(p.planId)}` : ''}{p.readingCount > 0 ? ` · ${p.readingCount} reading(s)` : ''}</option>)}
        </SelectField>
        <Button type="submit" size="sm" disabled={pointId === ''} busy={place.isPending}>Assign</Button>
      </form>
      <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); if (planId !== '') place.mutate({ surveyId, readingId: reading.id, body: { planId, xM: num(x), yM: num(y) } }, { onSuccess: onDone }); }}>
        {plans.length > 1 && (
          <SelectField label="Plan" value={planId} onChange={(e) => setPlanId(e.target.value ? Number(e.target.value) : '')} className="min-w-0 flex-1">
            {plans.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
          </SelectField>
        )}
        <TextField label="x (m)" inputMode="decimal" value={x} onChange={(e) => setX(e.target.value)} className="w-24" />
        <TextField label="y (m)" inputMode="decimal" value={y} onChange={(e) => setY(e.target.value)} className="w-24" />
        <Button type="submit" size="sm" variant="secondary" disabled={planId === ''} busy={place.isPending}>{plans.length > 1 ? 'Place on the plan' : 'Place on this plan'}</Button>
      </form>
      <FormError error={place.error} />
    </div>
  );
}
