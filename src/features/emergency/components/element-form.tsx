import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Pencil } from 'lucide-react';
import { ELEMENT_KIND_LABELS, EQUIPMENT_KINDS, EQUIPMENT_LABELS, type EmergencyElement, type EmergencyElementBody } from '@shared/schemas/emergency';
import type { EmergencyElementKind } from '@shared/core/emergency';
import type { PlanPoint } from '@shared/spatial/polygon';
import { Button } from '@/components/ui/button';
import { SelectField, TextField, TextAreaField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { useCreateElement } from '../api/create-element';
import { useUpdateElement } from '../api/update-element';
import { coordinatesText, parseCoordinates } from './format';
import type { DrawShape } from './emergency-map';

export const SHAPE_OF: Record<EmergencyElementKind, DrawShape> = { escape_route: 'Line', open_area: 'Polygon', high_risk_area: 'Polygon', safety_equipment: 'Marker' };
const SHAPE_WORDS: Record<DrawShape, string> = { Line: 'the centre line, from one end to the other (double-click or click the last point again to finish)', Polygon: 'the outline (click the first corner to close it)', Marker: 'where the equipment is' };

type Props = {
  planId: number;
  zones: readonly { id: number; name: string }[];
  /** Points drawn on the map (plan metres) for the element being added. */
  drawn: PlanPoint[] | null;
  onDrawRequest: (shape: DrawShape | null) => void;
  drawing: boolean;
  onSaved: () => void;
  /** An element to edit (its kind stays); absent: a new element. Remount (key) to switch. */
  editing?: EmergencyElement | null;
  onCancel?: () => void;
};

/**
 * Adds an escape route, open area, high-risk task area or safety-equipment point. The shape is
 * drawn on the plan or typed as "x y" pairs in metres (keyboard users, or exact survey drawings).
 */
export function ElementForm({ planId, zones, drawn, onDrawRequest, drawing, onSaved, editing = null, onCancel }: Props) {
  const [kind, setKind] = useState<EmergencyElementKind>(editing?.kind ?? 'escape_route');
  const [code, setCode] = useState(editing?.code ?? 'R1');
  const [name, setName] = useState(editing?.name ?? '');
  const [coords, setCoords] = useState(editing ? coordinatesText(editing.geometry) : '');
  const [width, setWidth] = useState(String(editing?.widthM ?? '1.2'));
  const [stair, setStair] = useState(editing?.stair ?? false);
  const [spacing, setSpacing] = useState(String(editing?.spacingM ?? '2'));
  const [border, setBorder] = useState(String(editing?.borderM ?? '0.5'));
  const [normal, setNormal] = useState(editing?.normalEmLux === null || editing?.normalEmLux === undefined ? '' : String(editing.normalEmLux));
  const [normalZone, setNormalZone] = useState(editing?.normalZoneId ? String(editing.normalZoneId) : '');
  const [equipment, setEquipment] = useState<(typeof EQUIPMENT_KINDS)[number]>(editing?.equipment ?? 'fire_fighting');
  const [problem, setProblem] = useState<string | null>(null);
  const [lastDrawn, setLastDrawn] = useState<PlanPoint[] | null>(null);
  const create = useCreateElement();
  const update = useUpdateElement();
  const nameRef = useRef<HTMLInputElement>(null);
  // Editing starts from the list below the plan: bring the form into view with the focus on it (keyboard users).
  useEffect(() => {
    if (!editing) return;
    nameRef.current?.focus();
    nameRef.current?.scrollIntoView?.({ block: 'center' });
  }, [editing]);

  // A new drawing fills the coordinates field (the render-time update React recommends over an effect).
  if (drawn !== lastDrawn) {
    setLastDrawn(drawn);
    if (drawn) setCoords(coordinatesText(drawn));
  }

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setProblem(null);
    const pts = parseCoordinates(coords);
    if (!pts) { setProblem('Give the shape as pairs "x y" in metres separated by semicolons, or draw it on the plan.'); return; }
    const n = (s: string) => Number(s.replace(',', '.'));
    let body: EmergencyElementBody;
    if (kind === 'escape_route') body = { kind, code, name, line: pts, widthM: n(width), stair, spacingM: n(spacing) };
    else if (kind === 'open_area') body = { kind, code, name, polygon: pts, borderM: n(border), spacingM: n(spacing) };
    else if (kind === 'high_risk_area') body = { kind, code, name, polygon: pts, spacingM: n(spacing), normalEmLux: normal ? n(normal) : null, normalZoneId: normalZone ? Number(normalZone) : null };
    else body = { kind, code, name, point: pts[0], equipment };
    if (editing) {
      update.mutate({ id: editing.id, body }, { onSuccess: () => onSaved() });
      return;
    }
    create.mutate({ planId, body }, {
      onSuccess: () => { setName(''); setCoords(''); setCode(nextCode(code)); onSaved(); },
    });
  };

  return (
    <form onSubmit={submit} className="space-y-3" aria-label={editing ? `Edit ${editing.code} ${editing.name}` : 'Add an emergency element'}>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Kind" value={kind} disabled={editing !== null} hint={editing ? 'An element keeps its kind' : undefined} onChange={(e) => { const k = e.target.value as EmergencyElementKind; setKind(k); setCode(k === 'escape_route' ? 'R1' : k === 'open_area' ? 'A1' : k === 'high_risk_area' ? 'H1' : 'E1'); onDrawRequest(null); }}>
          {Object.entries(ELEMENT_KIND_LABELS).map(([k, l]) => <option key={k} value={k}>{l}</option>)}
        </SelectField>
        <TextField label="Code" value={code} onChange={(e) => setCode(e.target.value)} hint="Starts each point label, e.g. R1-C01" required maxLength={12} />
      </div>
      <TextField ref={nameRef} label="Name" value={name} onChange={(e) => setName(e.target.value)} placeholder={kind === 'escape_route' ? 'Corridor to the east exit' : ''} required maxLength={120} />
      <div className="flex flex-wrap items-end gap-2">
        <TextAreaField className="min-w-0 flex-1" label={kind === 'safety_equipment' ? 'Position x y (m)' : kind === 'escape_route' ? 'Centre line x y; x y; … (m)' : 'Corners x y; x y; … (m)'} value={coords} onChange={(e) => setCoords(e.target.value)} rows={2}
          hint={drawing ? `Draw ${SHAPE_WORDS[SHAPE_OF[kind]]} on the plan.` : 'Type the points or draw them on the plan.'} />
        <Button type="button" variant="secondary" onClick={() => onDrawRequest(drawing ? null : SHAPE_OF[kind])} aria-pressed={drawing}>
          <Pencil className="h-4 w-4" aria-hidden />{drawing ? 'Stop drawing' : 'Draw on plan'}
        </Button>
      </div>
      {kind === 'escape_route' && (
        <div className="grid gap-3 sm:grid-cols-3">
          <TextField label="Width (m)" inputMode="decimal" value={width} onChange={(e) => setWidth(e.target.value)} hint="Over 2 m: planned and judged as 2 m strips (EN 1838)" />
          <TextField label="Point spacing (m)" inputMode="decimal" value={spacing} onChange={(e) => setSpacing(e.target.value)} />
          <label className="flex items-center gap-2 self-center text-sm text-ink-800"><input type="checkbox" checked={stair} onChange={(e) => setStair(e.target.checked)} className="h-4 w-4 rounded" />A stair</label>
        </div>
      )}
      {kind === 'open_area' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Border left out (m)" inputMode="decimal" value={border} onChange={(e) => setBorder(e.target.value)} hint="EN 1838: 0.5 m" />
          <TextField label="Grid spacing (m)" inputMode="decimal" value={spacing} onChange={(e) => setSpacing(e.target.value)} />
        </div>
      )}
      {kind === 'high_risk_area' && (
        <div className="grid gap-3 sm:grid-cols-3">
          <TextField label="Normal lighting Em (lx)" inputMode="decimal" value={normal} onChange={(e) => setNormal(e.target.value)} hint="Or choose the zone whose target gives it" />
          <SelectField label="…or from zone" value={normalZone} onChange={(e) => setNormalZone(e.target.value)}>
            <option value="">No zone</option>
            {zones.map((z) => <option key={z.id} value={z.id}>{z.name}</option>)}
          </SelectField>
          <TextField label="Grid spacing (m)" inputMode="decimal" value={spacing} onChange={(e) => setSpacing(e.target.value)} />
        </div>
      )}
      {kind === 'safety_equipment' && (
        <SelectField label="Equipment" value={equipment} onChange={(e) => setEquipment(e.target.value as typeof equipment)}>
          {EQUIPMENT_KINDS.map((k) => <option key={k} value={k}>{EQUIPMENT_LABELS[k]}</option>)}
        </SelectField>
      )}
      {problem && <FormError error={new Error(problem)} />}
      <FormError error={editing ? update.error : create.error} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending || update.isPending}>{editing ? `Save ${editing.code}` : `Add ${ELEMENT_KIND_LABELS[kind].toLowerCase()}`}</Button>
        {editing && onCancel && <Button type="button" variant="secondary" onClick={onCancel}>Cancel</Button>}
      </div>
    </form>
  );
}

/** R1 -> R2, A9 -> A10. */
function nextCode(code: string): string {
  const m = /^(.*?)(\d+)$/.exec(code);
  return m ? `${m[1]}${Number(m[2]) + 1}` : `${code}2`;
}
