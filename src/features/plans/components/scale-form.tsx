import { useState, type FormEvent } from 'react';
import { MousePointerClick, Ruler } from 'lucide-react';
import type { Plan } from '@shared/schemas/plans';
import { MIN_SCALE_SPAN_PX } from '@shared/schemas/plans';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useUpdatePlan } from '../api/update-plan';

export type ScalePick = { active: boolean; points: [number, number][] };

/**
 * Set the scale: either type the plan's width, or pick two points on the map (the parent
 * passes the picked image pixels) and type the distance between them.
 */
export function ScaleForm({ plan, pick, onPickChange }: { plan: Plan; pick: ScalePick; onPickChange: (p: ScalePick) => void }) {
  const update = useUpdatePlan();
  const [width, setWidth] = useState(plan.widthM ? String(Math.round(plan.widthM * 100) / 100) : '');
  const [distance, setDistance] = useState('');
  const [localError, setLocalError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  async function byWidth(e: FormEvent) {
    e.preventDefault();
    setLocalError(null); setDone(null);
    const w = Number(width.replace(',', '.'));
    if (!(w > 0)) return setLocalError('Type the plan width in metres, more than 0');
    await update.mutateAsync({ planId: plan.id, widthM: w }).then(() => setDone(`Scale set: the plan is ${w} m wide.`), () => {});
  }

  async function byPoints(e: FormEvent) {
    e.preventDefault();
    setLocalError(null); setDone(null);
    const d = Number(distance.replace(',', '.'));
    if (pick.points.length !== 2) return setLocalError('Click two points on the plan first');
    if (!(d > 0)) return setLocalError('Type the distance between the two points in metres');
    const [a, b] = pick.points;
    if (Math.hypot(a[0] - b[0], a[1] - b[1]) < MIN_SCALE_SPAN_PX) return setLocalError('The two points are too close together: pick points far apart');
    await update.mutateAsync({ planId: plan.id, scalePoints: [a, b], distanceM: d }).then(() => {
      setDone(`Scale set from two points ${d} m apart.`);
      onPickChange({ active: false, points: [] });
      setDistance('');
    }, () => {});
  }

  return (
    <div className="space-y-4">
      <form aria-label="Scale by width" onSubmit={byWidth} className="flex flex-wrap items-end gap-2" noValidate>
        <TextField label="Plan width (m)" inputMode="decimal" value={width} onChange={(e) => setWidth(e.target.value)} className="w-40" />
        <Button type="submit" variant="secondary" busy={update.isPending}><Ruler className="h-4 w-4" aria-hidden />Set width</Button>
      </form>
      <form aria-label="Scale by two points" onSubmit={byPoints} className="space-y-2" noValidate>
        <Button type="button" variant={pick.active ? 'primary' : 'secondary'} aria-pressed={pick.active} onClick={() => onPickChange({ active: !pick.active, points: [] })}>
          <MousePointerClick className="h-4 w-4" aria-hidden />{pick.active ? 'Picking: click two points on the plan' : 'Pick two points on the plan'}
        </Button>
        <p className="text-xs text-ink-600" aria-live="polite">
          {pick.points.length === 0 ? 'Pick two points whose distance you know, e.g. the ends of a wall.' : `${pick.points.length} of 2 points picked.`}
        </p>
        <div className="flex flex-wrap items-end gap-2">
          <TextField label="Distance between the points (m)" inputMode="decimal" value={distance} onChange={(e) => setDistance(e.target.value)} className="w-56" />
          <Button type="submit" busy={update.isPending} disabled={pick.points.length !== 2}>Set scale</Button>
        </div>
      </form>
      {localError && <FormError error={new Error(localError)} />}
      <FormError error={update.error} />
      {done && <p role="status" className="text-sm text-meets-700">{done}</p>}
      {plan.zoneCount > 0 && <p className="text-xs text-ink-500">Zones keep their place on the image when the scale changes.</p>}
    </div>
  );
}
