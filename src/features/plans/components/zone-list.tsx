import { Pencil, Trash2 } from 'lucide-react';
import { labelOfUseType, ZONE_KIND_LABELS, type Zone } from '@shared/schemas/zones';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { useDeleteZone } from '../api/delete-zone';

export function ZoneList({ zones, canEdit, onEdit }: { zones: readonly Zone[]; canEdit: boolean; onEdit: (z: Zone) => void }) {
  const remove = useDeleteZone();
  return (
    <>
      <FormError error={remove.error} />
      <ul className="divide-y divide-ink-100" aria-label="Zones">
        {zones.map((z) => (
          <li key={z.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
            <div className="min-w-0">
              <div className="font-medium text-ink-900">{z.name}</div>
              <div className="text-xs text-ink-500">{ZONE_KIND_LABELS[z.kind]} · {labelOfUseType(z.useType)} · {Math.round(z.areaM2 * 10) / 10} m² · plane {z.planeHeightM} m{z.kind === 'room' ? ` · wall band ${z.wallBandM} m` : ''}</div>
            </div>
            {canEdit && (
              <div className="flex gap-1">
                <Button size="sm" variant="ghost" onClick={() => onEdit(z)} aria-label={`Edit ${z.name}`}><Pencil className="h-4 w-4" aria-hidden />Edit</Button>
                <Button size="sm" variant="ghost" busy={remove.isPending && remove.variables?.zoneId === z.id} aria-label={`Delete ${z.name}`}
                  onClick={() => { if (window.confirm(`Delete the zone "${z.name}"? Readings stay; they are no longer assigned to it.`)) remove.mutate({ zoneId: z.id, planId: z.planId }); }}>
                  <Trash2 className="h-4 w-4" aria-hidden />Delete
                </Button>
              </div>
            )}
          </li>
        ))}
      </ul>
    </>
  );
}
