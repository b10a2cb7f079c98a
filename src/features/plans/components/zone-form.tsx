import { useState, type FormEvent } from 'react';
import { Save, TriangleAlert } from 'lucide-react';
import { isSafetyRelevant, ZONE_KIND_LABELS, ZONE_KINDS, ZONE_USE_TYPES, zoneBodySchema, type Zone } from '@shared/schemas/zones';
import { validatePolygon, type PlanExtent, type PlanPoint } from '@shared/spatial/polygon';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useCreateZone } from '../api/create-zone';
import { useUpdateZone } from '../api/update-zone';

const round = (v: number) => Math.round(v * 100) / 100;
export const cornersToText = (corners: readonly PlanPoint[]) => corners.map(([x, y]) => `${round(x)}, ${round(y)}`).join('\n');

/** Parses "x, y" per line (metres); says which line is wrong. */
export function parseCorners(text: string): { corners: PlanPoint[] } | { error: string } {
  const corners: PlanPoint[] = [];
  const lines = text.split('\n').map((l) => l.trim()).filter(Boolean);
  for (const [i, line] of lines.entries()) {
    const parts = line.split(/[\s,;]+/).filter(Boolean).map(Number);
    if (parts.length !== 2 || parts.some((n) => !Number.isFinite(n))) return { error: `Line ${i + 1} ("${line}") is not "x, y" in metres` };
    corners.push([parts[0], parts[1]]);
  }
  return { corners };
}

type Props = { planId: number; extent: PlanExtent; zone?: Zone | null; corners?: PlanPoint[] | null; onDone: () => void };

/** Add or change a zone: name, kind, use type, working plane, wall band and its corners. */
export function ZoneForm({ planId, extent, zone, corners, onDone }: Props) {
  const create = useCreateZone();
  const update = useUpdateZone();
  const [name, setName] = useState(zone?.name ?? '');
  const [kind, setKind] = useState<string>(zone?.kind ?? 'room');
  const [useType, setUseType] = useState<string>(zone?.useType ?? 'office_writing');
  const [plane, setPlane] = useState(String(zone?.planeHeightM ?? 0.75));
  const [band, setBand] = useState(String(zone?.wallBandM ?? 0.5));
  const [cornerText, setCornerText] = useState(cornersToText(corners ?? zone?.polygon ?? []));
  const [problems, setProblems] = useState<Record<string, string>>({});
  // Corners drawn or dragged on the map replace the typed ones (state adjusted during render).
  const [seenCorners, setSeenCorners] = useState(corners);
  if (corners !== seenCorners) {
    setSeenCorners(corners);
    if (corners) setCornerText(cornersToText(corners));
  }
  const mutation = zone ? update : create;

  async function submit(e: FormEvent) {
    e.preventDefault();
    const found: Record<string, string> = {};
    const parsedCorners = parseCorners(cornerText);
    if ('error' in parsedCorners) found.polygon = parsedCorners.error;
    else {
      const check = validatePolygon(parsedCorners.corners, extent);
      if (!check.ok) found.polygon = check.problems.join('; ');
    }
    const body = zoneBodySchema.safeParse({ name, kind, useType, planeHeightM: Number(plane), wallBandM: Number(band), polygon: 'corners' in parsedCorners ? parsedCorners.corners : [] });
    if (!body.success) for (const issue of body.error.issues) found[String(issue.path[0])] ??= issue.message;
    setProblems(found);
    if (Object.keys(found).length || !body.success) return;
    try {
      if (zone) await update.mutateAsync({ zoneId: zone.id, ...body.data });
      else await create.mutateAsync({ planId, ...body.data });
      onDone();
    } catch { /* shown below */ }
  }

  return (
    <form aria-label={zone ? `Edit zone ${zone.name}` : 'Add a zone'} onSubmit={submit} className="grid gap-3 sm:grid-cols-2" noValidate>
      <TextField label="Zone name" value={name} onChange={(e) => setName(e.target.value)} error={problems.name} className="sm:col-span-2" />
      <SelectField label="Kind" value={kind} onChange={(e) => setKind(e.target.value)} error={problems.kind}>
        {ZONE_KINDS.map((k) => <option key={k} value={k}>{ZONE_KIND_LABELS[k]}</option>)}
      </SelectField>
      <SelectField label="Use" value={useType} onChange={(e) => setUseType(e.target.value)} error={problems.useType}>
        {ZONE_USE_TYPES.map((u) => <option key={u.value} value={u.value}>{u.label}</option>)}
      </SelectField>
      <TextField label="Working plane (m)" inputMode="decimal" value={plane} onChange={(e) => setPlane(e.target.value)} error={problems.planeHeightM} hint="0.75 m in EN practice; 0 for floors and outdoor ground." />
      <TextField label="Wall band (m)" inputMode="decimal" value={band} onChange={(e) => setBand(e.target.value)} error={problems.wallBandM} hint="Rooms only: points this close to the walls are left out of the statistics." />
      <TextAreaField label="Corners (x, y in metres, one per line)" rows={5} value={cornerText} onChange={(e) => setCornerText(e.target.value)} error={problems.polygon}
        hint={`From the plan's lower-left corner, y upwards; the plan is ${round(extent.widthM)} × ${round(extent.heightM)} m. Draw on the map to fill these in.`} className="sm:col-span-2 font-mono" />
      {isSafetyRelevant(useType) && (
        <p role="note" className="flex gap-2 rounded-lg bg-lamp-50 p-2 text-xs text-lamp-900 ring-1 ring-lamp-200 sm:col-span-2">
          <TriangleAlert className="h-4 w-4 shrink-0" aria-hidden />Stairs and exit routes are safety-relevant: a survey supports a check, it does not certify emergency lighting. Local codes and a qualified lighting professional take precedence.
        </p>
      )}
      <div className="sm:col-span-2"><FormError error={mutation.error} /></div>
      <div className="flex gap-2 sm:col-span-2">
        <Button type="submit" busy={mutation.isPending}><Save className="h-4 w-4" aria-hidden />{zone ? 'Save zone' : 'Add zone'}</Button>
        <Button type="button" variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
