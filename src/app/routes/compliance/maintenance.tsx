import { Wrench } from 'lucide-react';
import { useMaintenance } from '@/features/compliance/api/get-maintenance';
import { MaintenanceList } from '@/features/compliance/components/maintenance-list';
import { SafetyCaution } from '@/features/compliance/components/safety-caution';
import { Page, PageHeader } from '@/components/ui/page';
import { EmptyState, QueryState } from '@/components/ui/states';

/** For the facility manager: zones whose signed-off levels fell below their maintained value, or are heading there. */
export function MaintenanceRoute() {
  const maintenance = useMaintenance();
  return (
    <Page>
      <PageHeader eyebrow="Lighting targets" title="Maintenance due" description="Each zone's signed-off average illuminance over time against its maintained value Ēm." />
      <QueryState query={maintenance} loadingLabel="Reading the signed-off surveys…" isEmpty={(d) => d.items.length === 0}
        empty={<EmptyState title="No signed-off values yet" icon={<Wrench className="h-6 w-6" aria-hidden />}>Zones appear here once a survey of their site has been signed off.</EmptyState>}>
        {(d) => (
          <div className="space-y-6">
            <p className="rounded-lg bg-ink-50 p-3 text-sm text-ink-700 ring-1 ring-ink-100">{d.rule}</p>
            <MaintenanceList items={d.items} />
            <SafetyCaution />
          </div>
        )}
      </QueryState>
    </Page>
  );
}
