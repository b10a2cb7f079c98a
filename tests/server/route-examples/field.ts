import type { RouteExamples } from './types';
import type { TestApp } from '../helpers';
import { pngOf } from '../support/factories';
import { draftSurveyId } from './surveys';

let n = 0;
const key = () => `example-${Date.now().toString(36)}-${(n++).toString(36)}`;
const at = () => new Date(Date.parse('2026-11-20T10:00:00Z') + n * 1000).toISOString();

/** One photo stored through the API per test app (the read example shares it). */
const photos = new WeakMap<TestApp, Promise<number>>();
function examplePhoto(t: TestApp): Promise<number> {
  if (!photos.has(t)) {
    photos.set(t, (async () => {
      const surveyId = await draftSurveyId(t);
      const admin = await t.signIn('admin@luxtrail.test');
      const res = await admin.post(`/api/surveys/${surveyId}/field/photos`).attach('file', pngOf(40, 30, 7), { filename: 'p.png', contentType: 'image/png' })
        .field('idempotencyKey', key()).field('takenAt', at());
      if (res.status !== 201) throw new Error(`example photo failed: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.photo.id as number;
    })());
  }
  return photos.get(t)!;
}

export const fieldExamples: RouteExamples = {
  'GET /surveys/:id/field': async (t) => ({ path: `/api/surveys/${await draftSurveyId(t)}/field` }),
  'POST /surveys/:id/field/sessions': async (t) => ({
    path: `/api/surveys/${await draftSurveyId(t)}/field/sessions`, okStatus: 201,
    body: { idempotencyKey: key(), measuredBy: 'Example surveyor', startedAt: at(), sky: 'night', daylightExcluded: true },
  }),
  'POST /surveys/:id/field/records': async (t) => ({
    path: `/api/surveys/${await draftSurveyId(t)}/field/records`, okStatus: 201,
    body: { idempotencyKey: key(), kind: 'skip', point: 'EX-1', reason: 'Blocked by shelving', recordedAt: at() },
  }),
  'POST /surveys/:id/field/photos': async (t) => ({
    path: `/api/surveys/${await draftSurveyId(t)}/field/photos`, okStatus: 201,
    files: { file: { content: pngOf(40, 30, n++), filename: 'photo.png', contentType: 'image/png' } },
    fields: { idempotencyKey: key(), takenAt: at(), point: 'EX-1' },
  }),
  'GET /field-photos/:id': async (t) => ({ path: `/api/field-photos/${await examplePhoto(t)}` }),
};
