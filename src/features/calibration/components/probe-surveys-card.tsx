import { RefreshCcw, ScrollText } from 'lucide-react';
import type { UseMutationResult } from '@tanstack/react-query';
import type { RedecodeResponse } from '@shared/schemas/readings';
import { useProbeSurveys } from '../api/get-probe-surveys';
import { Card, CardHeader } from '@/components/ui/card';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
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
                <div className="flex items-center gap-2">
                  {s.staleReadings > 0
                    ? <Badge tone="warn">{s.staleReadings} decoded with another set</Badge>
                    : <Badge tone="good">Current</Badge>}
                  {s.canRedecode
                    ? (
                      <Button size="sm" variant={s.staleReadings > 0 ? 'primary' : 'secondary'} onClick={() => start(s.surveyId)} busy={redecode.isPending && redecode.variables === s.surveyId} aria-label={`Re-decode ${s.name}`}>
                        <RefreshCcw className="h-4 w-4" aria-hidden />Re-decode
                      </Button>
                    )
                    : <Badge tone="neutral">Signed off: frozen</Badge>}
                </div>
              </li>
            ))}
          </ul>
        )}
      </QueryState>
      <div className="px-5 pb-3">
        <FormError error={redecode.error} />
        {redecode.isSuccess && <p role="status" className="text-sm text-meets-700">Re-decoded: {redecode.data.readings} readings in the new decode.</p>}
      </div>
    </Card>
  );
}
