import { eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { JobTx } from '../../lib/job-queue';
import { surveys } from '../../db/schema/surveys';
import { currentAggregate } from './verdict-aggregates';
import { allPartsTask } from './answer-parts';
import { runCompute } from '../../compute/compute-pool';

/** The queued job (a stored job name) that computes a survey's verdicts ahead of the first reader. */
export const WARM_VERDICTS_JOB = 'warm-verdicts';

/**
 * Queues the verdicts of a survey whose readings just changed wholesale (an import accepted, a
 * re-decode), in the transaction of that change: judging 500,000 readings takes seconds, and the
 * first person to open the verdicts should find them kept rather than wait. One attempt: a failure
 * only means the next reader computes them. `runAt`: not before then (an import lets its threads
 * end first, so their heaps and the judging's are not held at once).
 */
export function queueWarmVerdicts(tx: JobTx, jobs: Deps['jobs'], surveyId: number, runAt?: number): void {
  jobs.send(tx, WARM_VERDICTS_JOB, { surveyId }, { maxAttempts: 1, ...(runAt !== undefined ? { runAt } : {}) });
}

/**
 * The job: the survey's current aggregate, computed on a compute thread unless it is kept already
 * (or the survey is signed off), then every zone's points and plan's map readings built beside it,
 * so the first people to open the zones do not queue behind each other's builds.
 */
export async function warmVerdicts(deps: Deps, data: unknown): Promise<void> {
  const { surveyId } = data as { surveyId: number };
  const survey = deps.db.select().from(surveys).where(eq(surveys.id, surveyId)).get();
  if (!survey || survey.status === 'signed_off') return;
  const aggregate = await currentAggregate(deps.db, survey);
  await runCompute(deps.db, allPartsTask, { surveyId, aggregateId: aggregate.id });
}
