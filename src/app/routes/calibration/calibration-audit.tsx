import { useSearchParams } from 'react-router';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useAudit } from '@/features/audit/api/get-audit';
import { AuditList } from '@/features/audit/components/audit-list';
import { useProbes } from '@/features/calibration/api/get-probes';
import { Page, PageHeader } from '@/components/ui/page';
import { Card } from '@/components/ui/card';
import { SelectField } from '@/components/ui/field';
import { EmptyState, QueryState } from '@/components/ui/states';

const ENTITY_FILTERS = [
  { value: '', label: 'Everything' },
  { value: 'probe', label: 'Probes' },
  { value: 'coefficient_set', label: 'Coefficient sets' },
  { value: 'bench_run', label: 'Bench runs' },
];

/** The audit trail, filterable by probe (for those who may see probes) and by kind of record. */
export function CalibrationAuditRoute() {
  const user = useCurrentUser();
  const [params, setParams] = useSearchParams();
  const probeId = Number(params.get('probe')) || undefined;
  const entityType = params.get('kind') || undefined;
  const mayFilterProbes = can(user.role, 'probes.read');
  const probes = useProbes(mayFilterProbes);
  const audit = useAudit({ probeId, entityType, limit: 200 });
  const serialOf = (id: number) => probes.data?.items.find((p) => p.id === id)?.serial;
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value); else next.delete(key);
    setParams(next, { replace: true });
  };
  return (
    <Page>
      <PageHeader eyebrow="Calibration" title="Audit trail" description="Every creation, change, approval and retirement: who, when, and each field before and after. The trail is append-only." />
      <Card>
        <div className="flex flex-wrap gap-4 border-b border-ink-100 px-5 py-3">
          {mayFilterProbes && (
            <SelectField label="Probe" className="w-56" value={probeId ?? ''} onChange={(e) => set('probe', e.target.value)}>
              <option value="">All probes</option>
              {probes.data?.items.map((p) => <option key={p.id} value={p.id}>{p.serial}</option>)}
            </SelectField>
          )}
          <SelectField label="Record" className="w-56" value={entityType ?? ''} onChange={(e) => set('kind', e.target.value)}>
            {ENTITY_FILTERS.map((f) => <option key={f.value} value={f.value}>{f.label}</option>)}
          </SelectField>
        </div>
        <QueryState query={audit} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="Nothing recorded for this filter" />}>
          {(d) => <AuditList events={d.items} probeLabel={serialOf} />}
        </QueryState>
      </Card>
    </Page>
  );
}
