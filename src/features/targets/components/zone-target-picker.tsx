import { SelectField } from '@/components/ui/field';
import { FormError } from '@/components/ui/form-error';
import { QueryState } from '@/components/ui/states';
import { useTargets } from '../api/get-targets';
import { useZoneTarget } from '../api/get-zone-target';
import { useSetZoneTarget } from '../api/set-zone-target';

/** Chooses the library entry a zone is judged against ("by use type" clears the choice). */
export function ZoneTargetPicker({ zoneId, onChanged }: { zoneId: number; onChanged?: () => unknown }) {
  const targets = useTargets();
  const current = useZoneTarget(zoneId);
  const set = useSetZoneTarget(onChanged);
  return (
    <QueryState query={current}>
      {(z) => (
        <div className="max-w-xl space-y-2">
          <SelectField label="Library entry" value={z.targetId ?? ''} disabled={set.isPending || targets.isPending}
            onChange={(e) => set.mutate({ zoneId, targetId: e.target.value ? Number(e.target.value) : null })}
            hint={z.target ? `Now: ${z.target.name} (${z.target.source})` : `No entry for use type ${z.useType}`}>
            <option value="">By use type ({z.useType})</option>
            {(targets.data?.items ?? []).map((t) => <option key={t.id} value={t.id}>{t.name} · {t.useType}{t.shipped ? '' : ' (yours)'}</option>)}
          </SelectField>
          <FormError error={set.error ?? targets.error} />
        </div>
      )}
    </QueryState>
  );
}
