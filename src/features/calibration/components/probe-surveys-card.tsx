import { Link } from 'react-router';
import { paths } from '@shared/paths';
import { RefreshCcw, ScrollText } from 'lucide-react';
import type { UseMutationResult } from '@tanstack/react-query';
import type { RedecodeResponse } from '@shared/schemas/readings';
import { useProbeSurveys } from '../api/get-probe-surveys';
import { Card, CardHeader } from '@/components/ui/card';
import { Badge } from '@/components/ui/badge';
import { ConfirmAction } from '@/components/ui/confirm-action';
import { EmptyState, QueryState } from '@/components/ui/states';
import { FormError } from '@/components/ui/form-error';

/**
 * Surveys decoded with this probe. After a corrected set is approved, the ones whose readings
 * were decoded with another set can be re-decoded; the earlier decode stays recorded.
 * `redecode` is the surveys feature's mutation, handed down by the page that composes both.
 */
export function ProbeSurveysCard({ probeId, redecode }: { probeId: number; redecode: UseMutationResult<RedecodeResponse, Error, number> }) {
  const surveys = useProbeSurveys(probeId, true);
  // The mutation refreshes the survey and every probe's list of surveys (probeKeys).
  const start = (surveyId: number) => redecode.mutate(surveyId);
  return (
    <Card>
      <CardHeader title="Surveys decoded with this probe" description="A re-decode applies the approved sets in force now to the kept samples; the earlier decode stays recorded and the audit trail names who did it." />
      <QueryState query={surveys} isEmpty={(d) => d.items.length === 0} empty={<EmptyState title="No survey has readings from this probe" icon={<ScrollText className="h-6 w-6" />} />}>
        {(d) => (
          <ul className="divide-y divide-ink-100">
            {d.items.map((s) => (
              <li key={s.surveyId} className="flex flex-wrap items-center justify-between gap-3 px-5 py-3">
                <div className="min-w-0">
                  <div className="font-medium text-ink-900">{s.name}</div>
                  <div className="text-xs text-ink-500">{s.siteName} · {s.readings} readings</div>
                </div>
                <div className="flex flex-wrap items-center gap-2">
                  {s.staleReadings > 0
                    ? <Badge tone="warn">{s.staleReadings} decoded with another set</Badge>
                    : <Badge tone="good">Current</Badge>}
                  <Link className="text-sm font-medium text-lamp-700 underline-offset-2 hover:underline" to={paths.decodeChanges.to(s.surveyId)}>What changed</Link>
                  {s.canRedecode && s.staleReadings > 0
                    ? (
                      <ConfirmAction busy={redecode.isPending && redecode.variables === s.surveyId} aria-label={`Re-decode ${s.name}`}
                        trigger={<><RefreshCcw className="h-4 w-4" aria-hidden />Re-decode…</>}
                        consequence={<>Re-decoding “{s.name}” decodes all its kept samples again with the approved sets in force now; {s.staleReadings} reading(s) of this probe were decoded with a set that no longer applies to their time. The new decode replaces the current one for verdicts and exports; the earlier decode stays recorded. It cannot be undone.</>}
                        confirmLabel={<><RefreshCcw className="h-4 w-4" aria-hidden />Re-decode now</>}
                        onConfirm={() => start(s.surveyId)} />
                    )
                    : s.canRedecode ? null
                    : <Badge tone="neutral">Signed off: frozen</Badge>}
                </div>
              </li>
            ))}
          </ul>
        )}
      </QueryState>
      <div className="px-5 pb-3">
        <FormError error={redecode.error} />
        {redecode.isSuccess && (
          <p role="status" className="text-sm text-meets-700">
            Re-decoded: {redecode.data.readings} readings in the new decode. <Link className="font-medium underline" to={paths.decodeChanges.to(redecode.variables ?? 0)}>See what changed</Link>
          </p>
        )}
      </div>
    </Card>
  );
}
