import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { History, PenLine, Plus } from 'lucide-react';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useProbe } from '@/features/calibration/api/get-probe';
import { useCoefficientSets } from '@/features/calibration/api/get-coefficient-sets';
import { useBenchRuns } from '@/features/calibration/api/get-bench-runs';
import { ProbeSummary } from '@/features/calibration/components/probe-summary';
import { CoefficientSetList } from '@/features/calibration/components/coefficient-set-list';
import { ManualDraftForm } from '@/features/calibration/components/manual-draft-form';
import { BenchUploadForm } from '@/features/calibration/components/bench-upload-form';
import { BenchRunList } from '@/features/calibration/components/bench-run-list';
import { ProbeSurveysCard } from '@/features/calibration/components/probe-surveys-card';
import { useRedecodeAnySurvey } from '@/features/surveys/api/redecode-survey';
import { Page, PageHeader } from '@/components/ui/page';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';

/** One probe: its properties, every coefficient-set version, bench runs and uploads. */
export function ProbeDetailRoute() {
  const probeId = Number(useParams().probeId);
  const user = useCurrentUser();
  const navigate = useNavigate();
  const probe = useProbe(probeId);
  const canReadSets = can(user.role, 'coefficients.read');
  const sets = useCoefficientSets(probeId, canReadSets);
  const runs = useBenchRuns(probeId, canReadSets && probe.data?.kind === 'counts');
  const [drafting, setDrafting] = useState(false);
  const canWrite = can(user.role, 'coefficients.write');
  const redecode = useRedecodeAnySurvey();
  return (
    <Page>
      <QueryState query={probe}>
        {(p) => {
          const active = p.status !== 'retired';
          const current = sets.data?.items.find((s) => s.inForce) ?? null;
          return (
            <>
              <PageHeader eyebrow={<Link to={paths.probes.to()} className="hover:underline">Probes</Link>} title={p.serial} description={p.description}
                actions={(
                  <>
                    {can(user.role, 'audit.read') && <Link to={paths.audit.to(p.id)} className="inline-flex items-center gap-2 rounded-lg bg-white px-4 py-2 text-sm font-medium text-ink-900 ring-1 ring-inset ring-ink-200 hover:bg-ink-50"><History className="h-4 w-4" aria-hidden />Audit trail</Link>}
                    {can(user.role, 'probes.write') && active && <Link to={paths.probeEdit.to(p.id)} className="inline-flex items-center gap-2 rounded-lg bg-ink-900 px-4 py-2 text-sm font-medium text-white hover:bg-ink-800"><PenLine className="h-4 w-4" aria-hidden />Edit probe</Link>}
                  </>
                )} />
              <div className="grid gap-6 lg:grid-cols-[22rem_1fr]">
                <Card className="self-start"><CardHeader title="Probe" /><CardBody><ProbeSummary probe={p} /></CardBody></Card>
                <div className="min-w-0 space-y-6">
                  {canReadSets && (
                    <Card>
                      <CardHeader title="Coefficient sets" description="Each version is drafted, then approved by a second person; approved versions never change. Only approved sets decode readings."
                        actions={canWrite && active && !drafting ? <Button variant="secondary" size="sm" onClick={() => setDrafting(true)}><Plus className="h-4 w-4" aria-hidden />Draft by hand</Button> : undefined} />
                      <CardBody className="space-y-4">
                        {drafting && (
                          <div className="rounded-lg bg-ink-50 p-4">
                            <ManualDraftForm probe={p} current={current} onDone={() => setDrafting(false)} />
                            <Button variant="ghost" size="sm" className="mt-2" onClick={() => setDrafting(false)}>Cancel</Button>
                          </div>
                        )}
                        <QueryState query={sets} isEmpty={(d) => d.items.length === 0}
                          empty={<EmptyState title="No coefficient sets yet">{p.kind === 'counts' ? 'Upload a bench run below and draft a set from its fit, or draft one by hand.' : 'Draft one by hand from the transmitter\'s certificate.'}</EmptyState>}>
                          {(d) => <CoefficientSetList sets={d.items} userId={user.id} canWrite={canWrite && active} canApprove={can(user.role, 'coefficients.approve') && active} />}
                        </QueryState>
                      </CardBody>
                    </Card>
                  )}
                  {canReadSets && p.kind === 'counts' && (
                    <Card>
                      <CardHeader title="Bench runs" description="Upload the bench CSV; Luxtrail fits a line per gain code and keeps the raw file." />
                      <CardBody className="space-y-6">
                        {can(user.role, 'probes.write') && active && (
                          <BenchUploadForm probeId={p.id} defaults={{ tRefMs: current?.tRefMs ?? 100, alphaPerK: current?.alphaPerK ?? 0, tCalC: current?.tCalC ?? 23 }}
                            onUploaded={(r) => navigate(paths.benchRun.to(r.id))} />
                        )}
                        <QueryState query={runs} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No bench runs yet" />}>
                          {(d) => <BenchRunList runs={d.items} />}
                        </QueryState>
                      </CardBody>
                    </Card>
                  )}
                  {can(user.role, 'surveys.redecode') && <ProbeSurveysCard probeId={p.id} redecode={redecode} />}
                </div>
              </div>
            </>
          );
        }}
      </QueryState>
    </Page>
  );
}
