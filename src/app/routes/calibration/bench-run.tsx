import { Link, useNavigate, useParams } from 'react-router';
import { AlertTriangle, FileDown } from 'lucide-react';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useBenchRun } from '@/features/calibration/api/get-bench-run';
import { apiFiles } from '@shared/paths';
import { useProbe } from '@/features/calibration/api/get-probe';
import { BenchFitCharts, BenchFitTable } from '@/features/calibration/components/bench-fit-view';
import { BenchDraftForm } from '@/features/calibration/components/bench-draft-form';
import { formatInstant } from '@/features/calibration/components/format';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

/** A bench run's fit: table, charts, flags, and drafting a set from it. */
export function BenchRunRoute() {
  const benchRunId = Number(useParams().benchRunId);
  const user = useCurrentUser();
  const navigate = useNavigate();
  const run = useBenchRun(benchRunId);
  const probe = useProbe(run.data?.probeId ?? 0);
  return (
    <Page>
      <QueryState query={run}>
        {(r) => {
          const codes = probe.data?.gains?.map((g) => g.code) ?? [];
          const missing = codes.filter((c) => !r.gains.some((g) => g.code === c));
          return (
            <>
              <PageHeader eyebrow={<Link to={paths.probe.to(r.probeId)} className="hover:underline">{probe.data?.serial ?? 'Probe'}</Link>}
                title={`Bench run #${r.id}`} description={`${r.filename} · ${r.rowCount} rows · uploaded by ${r.createdBy ?? 'unknown'} on ${formatInstant(r.createdAt)} · tref ${r.options.tRefMs} ms, reference u rel ${(r.options.referenceURel * 100).toFixed(2)} %`}
                actions={<a href={apiFiles.benchRunFile(r.id)} className="inline-flex items-center gap-2 rounded-lg bg-white px-4 py-2 text-sm font-medium text-ink-900 ring-1 ring-inset ring-ink-200 hover:bg-ink-50"><FileDown className="h-4 w-4" aria-hidden />Raw file</a>} />
              <div className="space-y-6">
                {r.issues.length > 0 && (
                  <div role="status" className="rounded-lg bg-lamp-50 p-4 text-sm text-lamp-900 ring-1 ring-inset ring-lamp-200">
                    <p className="flex items-center gap-2 font-semibold"><AlertTriangle className="h-4 w-4" aria-hidden />Check before drafting</p>
                    <ul className="mt-1 list-disc pl-6">{r.issues.map((i) => <li key={i}>{i}</li>)}</ul>
                  </div>
                )}
                <Card><CardHeader title="Fit per gain code" description="Least-squares line of counts against reference illuminance; standard uncertainties (k = 1) from the fit's covariance." /><BenchFitTable run={r} /></Card>
                <Card><CardHeader title="Fit charts" /><CardBody><BenchFitCharts run={r} /></CardBody></Card>
                {can(user.role, 'coefficients.write') && (
                  <Card>
                    <CardHeader title="Draft a coefficient set from this fit" description="The draft takes this fit's coefficients, its reference conditions and the suggested uncertainties." />
                    <CardBody>
                      <BenchDraftForm probeId={r.probeId} benchRunId={r.id}
                        disabledReason={missing.length ? `This run has no rows for gain code(s) ${missing.join(', ')}; a set needs every code.` : null}
                        onDrafted={() => navigate(paths.probe.to(r.probeId))} />
                    </CardBody>
                  </Card>
                )}
              </div>
            </>
          );
        }}
      </QueryState>
    </Page>
  );
}
