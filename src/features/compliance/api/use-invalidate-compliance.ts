import { useQueryClient } from '@tanstack/react-query';
import type { ComplianceResponse } from '@shared/schemas/compliance';
import type { WorkflowState } from '@shared/schemas/workflow';
import { siteKeys, surveyKeys } from '@/lib/query-keys';

/**
 * After a workflow step: the new state goes into the survey's cached verdicts at once (so the page
 * never shows the old status or form while the verdicts are fetched again), then the survey with
 * everything keyed under it (its status and abilities, verdicts, zones), the survey lists (status
 * column) and the sites overview are fetched again.
 */
export function useInvalidateCompliance() {
  const qc = useQueryClient();
  return (surveyId: number, state?: WorkflowState) => {
    if (state) {
      qc.setQueryData<ComplianceResponse>(surveyKeys.compliance(surveyId), (c) => c && {
        ...c, status: state.status, reviewComment: state.reviewComment, submittedAt: state.submittedAt, submittedByName: state.submittedByName,
        signedOffAt: state.signedOffAt, signedOffByName: state.signedOffByName, frozen: state.status === 'signed_off' ? true : c.frozen,
        // Until the server's abilities arrive with the refetch, no step the new status rules out is offered (a signed-off survey is read-only).
        abilities: state.status === 'signed_off'
          ? Object.fromEntries(Object.keys(c.abilities).map((k) => [k, false])) as typeof c.abilities
          : { ...c.abilities, submit: false, signOff: false, return: false },
      });
    }
    return Promise.all([
      qc.invalidateQueries({ queryKey: siteKeys.overview() }),
      qc.invalidateQueries({ queryKey: surveyKeys.detail(surveyId) }),
      qc.invalidateQueries({ queryKey: surveyKeys.lists() }),
    ]);
  };
}
