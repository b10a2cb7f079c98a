import { Link, useParams } from 'react-router';
import { can } from '@shared/policy';
import { useCurrentUser } from '@/app/current-user';
import { useZoneCompliance } from '@/features/compliance/api/get-zone-compliance';
import { useInvalidateCompliance } from '@/features/compliance/api/use-invalidate-compliance';
import { ZoneChecksCard, ZonePointsTable, ZoneSummaryCards } from '@/features/compliance/components/zone-detail';
import { RuleNote } from '@/features/compliance/components/rule-note';
import { SafetyCaution } from '@/features/compliance/components/safety-caution';
import { ZoneTargetPicker } from '@/features/targets/components/zone-target-picker';
import { Card, CardBody, CardHeader } from '@/components/ui/card';
import { Page, PageHeader } from '@/components/ui/page';
import { EmptyState, QueryState } from '@/components/ui/states';
import { paths } from '@shared/paths';
import { formatDateTime } from '@shared/datetime';
import { labelOfUseType, ZONE_KIND_LABELS } from '@shared/schemas/zones';

/** One zone of a survey: its points, statistics, target and source. */
export function ZoneComplianceRoute() {
  const params = useParams();
  const surveyId = Number(params.surveyId);
  const zoneId = Number(params.zoneId);
  const user = useCurrentUser();
  const detail = useZoneCompliance(surveyId, zoneId);
  const invalidate = useInvalidateCompliance();
  return (
    <Page>
      <QueryState query={detail} loadingLabel="Loading the zone…">
        {(d) => (
          <div className="space-y-6">
            <PageHeader eyebrow={<Link to={paths.surveyCompliance.to(surveyId)} className="hover:underline">Back to the survey</Link>} title={d.zone.name}
              description={`${d.zone.planName} · ${ZONE_KIND_LABELS[d.zone.kind]} · ${labelOfUseType(d.zone.useType)}`} />
            <RuleNote rule={d.rule} ruleText={d.ruleText} frozen={d.frozen} />
            <ZoneSummaryCards detail={d} />
            <ZoneChecksCard detail={d} />
            {!d.frozen && can(user.role, 'plans.write') && (
              <Card>
                <CardHeader title="Which library entry and value apply" description="By default a zone is judged against the required value of the entry for its use type; choose another entry (e.g. a client's stricter specification), or the value the design chose with the context modifiers behind it." />
                <CardBody><ZoneTargetPicker zoneId={zoneId} onChanged={() => invalidate(surveyId)} /></CardBody>
              </Card>
            )}
            <Card>
              <CardHeader title="Points" description="Points in the wall band are shown but left out of the statistics." />
              {d.points.length === 0 ? <EmptyState title="No readings in this zone" /> : <ZonePointsTable detail={d} />}
            </Card>
            <Card>
              <CardHeader title="Photos and notes from the field" description="Taken and written on site with the field view, on this zone or one of its points (photo locations removed unless the surveyor kept them)." />
              <CardBody>
                {d.photos.length === 0 && d.notes.length === 0 ? <EmptyState title="No photos or notes of this zone" /> : (
                  <div className="flex flex-col gap-4">
                    {d.photos.length > 0 && (
                      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
                        {d.photos.map((p) => (
                          <li key={p.id} className="flex flex-col gap-1">
                            <a href={p.url} target="_blank" rel="noreferrer" className="block overflow-hidden rounded-lg ring-1 ring-ink-200 focus:ring-2 focus:ring-lamp-500">
                              <img src={p.url} alt={`Photo at ${p.point ?? d.zone.name}${p.note ? `: ${p.note}` : ''}`} width={p.widthPx} height={p.heightPx} loading="lazy" className="h-auto w-full object-cover" />
                            </a>
                            <span className="text-sm text-ink-700">{p.point ?? 'Zone'} · {formatDateTime(p.takenAt, d.siteTimeZone)}{p.note ? ` · ${p.note}` : ''}</span>
                          </li>
                        ))}
                      </ul>
                    )}
                    {d.notes.length > 0 && (
                      <ul aria-label="Notes on the zone" className="flex flex-col gap-2">
                        {d.notes.map((n) => (
                          <li key={n.id} className="rounded-lg bg-ink-50 p-3 text-sm text-ink-950">
                            <span className="font-semibold">{formatDateTime(n.recordedAt, d.siteTimeZone)}</span>
                            <p className="mt-1 whitespace-pre-line">{n.note}</p>
                          </li>
                        ))}
                      </ul>
                    )}
                  </div>
                )}
              </CardBody>
            </Card>
            <SafetyCaution />
          </div>
        )}
      </QueryState>
    </Page>
  );
}
