// Sends the outbox to the server, oldest first. Each record carries its idempotency key, so a
// sync interrupted after the server stored a record (and before the phone heard back) stores
// nothing twice when it runs again. A refusal (4xx) keeps the item with the server's reason.
import { api, ApiRequestError } from '@/lib/api-client';
import { markRefused, outboxItems, removeItem, type OutboxItem } from './field-db';

/**
 * Why a pass stopped before the end: the server could not be reached (no network, whatever
 * navigator.onLine says), or it answered with a fault or asked to wait (5xx, 401, 429).
 */
export type SyncStop = 'unreachable' | 'server' | null;
export type SyncOutcome = { sent: number; refused: number; stopped: SyncStop };

async function send(item: OutboxItem): Promise<void> {
  if (item.kind === 'session') await api.post(`/surveys/${item.surveyId}/field/sessions`, item.body);
  else if (item.kind === 'record') await api.post(`/surveys/${item.surveyId}/field/records`, item.body);
  else {
    const form = new FormData();
    form.set('idempotencyKey', item.body.idempotencyKey);
    form.set('takenAt', item.body.takenAt);
    form.set('keepLocation', String(item.body.keepLocation));
    if (item.body.point) form.set('point', item.body.point);
    if (item.body.plannedPointId) form.set('plannedPointId', String(item.body.plannedPointId));
    if (item.body.zoneId) form.set('zoneId', String(item.body.zoneId));
    if (item.body.note) form.set('note', item.body.note);
    form.set('file', item.blob, item.body.filename);
    await api.upload(`/surveys/${item.surveyId}/field/photos`, form);
  }
}

/** A refusal the surveyor must see (the item will never pass as it is), not a reason to wait. */
function isRefusal(e: unknown): e is ApiRequestError {
  return e instanceof ApiRequestError && e.status >= 400 && e.status < 500 && e.status !== 401 && e.status !== 429;
}

let running: Promise<SyncOutcome> | null = null;

/** Runs one pass over the waiting items (one pass at a time per page). */
export function syncOutbox(): Promise<SyncOutcome> {
  running ??= (async () => {
    const out: SyncOutcome = { sent: 0, refused: 0, stopped: null };
    try {
      for (const item of await outboxItems()) {
        if (item.state !== 'waiting') continue;
        try {
          await send(item);
          await removeItem(item.key);
          out.sent++;
        } catch (e) {
          if (isRefusal(e)) {
            await markRefused(item.key, e.message);
            out.refused++;
          } else {
            // The item waits for the next pass; later items wait behind it to keep their order.
            out.stopped = e instanceof ApiRequestError && e.status !== 0 ? 'server' : 'unreachable';
            break;
          }
        }
      }
    } finally {
      running = null;
    }
    return out;
  })();
  return running;
}

const FIRST_RETRY_MS = 2_000;
const LONGEST_RETRY_MS = 60_000;

/**
 * How long to wait before the next pass after `failedPasses` passes in a row stopped early:
 * 2 s doubling to at most a minute. navigator.onLine and the 'online' event cannot be trusted
 * to say the server is reachable again (a phone on a weak signal or a captive network reports
 * itself online), so a stopped pass is always tried again on a timer as well.
 */
export function retryDelayMs(failedPasses: number): number {
  return Math.min(LONGEST_RETRY_MS, FIRST_RETRY_MS * 2 ** Math.max(0, failedPasses - 1));
}
