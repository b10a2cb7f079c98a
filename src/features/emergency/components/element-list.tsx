import { Pencil, Trash2 } from 'lucide-react';
import { ELEMENT_KIND_LABELS, EQUIPMENT_LABELS, type EmergencyElement } from '@shared/schemas/emergency';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { useDeleteElement } from '../api/delete-element';

const m = (v: number) => v.toLocaleString('en-GB', { maximumFractionDigits: 1 });

/** The plan's elements with their size and planned points; delete for those who may edit the plan. */
export function ElementList({ elements, canEdit, onEdit }: { elements: readonly EmergencyElement[]; canEdit: boolean; onEdit?: (e: EmergencyElement) => void }) {
  const del = useDeleteElement();
  return (
    <div className="space-y-2">
      <FormError error={del.error} />
      <ul className="divide-y divide-ink-100" aria-label="Emergency elements">
        {elements.map((e) => (
          <li key={e.id} className="py-3">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <div className="min-w-0">
                <p className="font-medium text-ink-900"><span className="num mr-2 text-ink-500">{e.code}</span>{e.name}</p>
                <p className="text-xs text-ink-500">
                  {ELEMENT_KIND_LABELS[e.kind]}
                  {e.kind === 'escape_route' && ` · ${m(e.lengthM ?? 0)} m long, ${e.widthM} m wide, points every ≤ ${e.spacingM} m`}
                  {e.kind === 'escape_route' && (e.widthM ?? 0) > 2 && ` · ${new Set(e.plannedPoints.map((p) => p.strip)).size} strips of ≤ 2 m`}
                  {(e.kind === 'open_area' || e.kind === 'high_risk_area') && ` · ${m(e.lengthM ?? 0)} m²`}
                  {e.kind === 'high_risk_area' && ` · normal Em ${e.effectiveNormalEmLux ?? 'not given'} lx`}
                  {e.equipment && ` · ${EQUIPMENT_LABELS[e.equipment]}`}
                </p>
              </div>
              <div className="flex items-center gap-2">
                {e.stair && <Badge tone="warn">Stair</Badge>}
                <Badge>{e.plannedPoints.length} planned point{e.plannedPoints.length === 1 ? '' : 's'}</Badge>
                {canEdit && onEdit && (
                  <Button size="sm" variant="ghost" onClick={() => onEdit(e)} aria-label={`Edit ${e.code} ${e.name}`}>
                    <Pencil className="h-4 w-4" aria-hidden />
                  </Button>
                )}
                {canEdit && (
                  <Button size="sm" variant="ghost" onClick={() => del.mutate({ id: e.id, planId: e.planId })} aria-label={`Delete ${e.code} ${e.name}`}>
                    <Trash2 className="h-4 w-4" aria-hidden />
                  </Button>
                )}
              </div>
            </div>
            <details className="mt-1 text-xs text-ink-600">
              <summary className="cursor-pointer">Planned point labels</summary>
              <p className="num mt-1 break-words">{e.plannedPoints.map((p) => `${p.label} (${p.xM}, ${p.yM})`).join(' · ')}</p>
            </details>
          </li>
        ))}
      </ul>
    </div>
  );
}
