// Sends the outbox to the server, oldest first. Each record carries its idempotency key, so a
// sync interrupted after the server stored a record (and before the phone heard back) stores
// nothing twice when it runs again. A refusal (4xx) keeps the item with the server's reason.
import { api, ApiRequestError } from '@/lib/api-client';
import { markRefused, outboxItems, removeItem, type OutboxItem } from './field-db';

export type SyncOutcome = { sent: number; refused: number; stoppedOffline: boolean };

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

let running: Promise<SyncOutcome> | null = null;

/** Runs one pass over the waiting items (one pass at a time per page). */
export function syncOutbox(): Promise<SyncOutcome> {
  running ??= (async () => {
    const out: SyncOutcome = { sent: 0, refused: 0, stoppedOffline: false };
    try {
      for (const item of await outboxItems()) {
        if (item.state !== 'waiting') continue;
        try {
          await send(item);
          await removeItem(item.key);
          out.sent++;
        } catch (e) {
          if (e instanceof ApiRequestError && e.status >= 400 && e.status < 500 && e.status !== 401 && e.status !== 429) {
            await markRefused(item.key, e.message);
            out.refused++;
          } else {
            // Offline, signed out or a server fault: the item waits for the next pass.
            out.stoppedOffline = true;
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
