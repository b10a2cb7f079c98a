import type { RouteExamples } from './types';
import { DEMO, type TestApp } from '../helpers';
import { benchCsv, countingProbeBody, manualDraftBody, manualGains, probeIdBySerial, TINY_PDF } from '../support/factories';

async function freshProbe(t: TestApp): Promise<number> {
  const c = await t.signIn(DEMO.calibration);
  return (await c.post('/api/probes').send(countingProbeBody())).body.id;
}

/** A draft by calibration2@, so calibration@ and admin@ may approve it (four-eyes). */
async function colleagueDraft(t: TestApp): Promise<number> {
  const probeId = await freshProbe(t);
  const c2 = await t.signIn(DEMO.calibration2);
  return (await c2.post(`/api/probes/${probeId}/coefficient-sets`).send(manualDraftBody())).body.id;
}

async function benchRun(t: TestApp): Promise<number> {
  const probeId = await freshProbe(t);
  const c = await t.signIn(DEMO.calibration);
  return (await c.post(`/api/probes/${probeId}/bench-runs`).attach('file', Buffer.from(benchCsv(manualGains())), 'bench.csv')).body.id;
}

const csvFile = () => ({ file: { content: Buffer.from(benchCsv(manualGains())), filename: 'bench.csv', contentType: 'text/csv' } });

export const calibrationExamples: RouteExamples = {
  'GET /probes': () => ({ path: '/api/probes' }),
  'POST /probes': () => ({ path: '/api/probes', body: countingProbeBody(), okStatus: 201 }),
  'GET /probes/:id': (t) => ({ path: `/api/probes/${probeIdBySerial(t, 'LX-4102')}` }),
  'PATCH /probes/:id': async (t) => ({ path: `/api/probes/${await freshProbe(t)}`, body: { description: 'Relabelled' } }),
  'GET /probes/:id/surveys': (t) => ({ path: `/api/probes/${probeIdBySerial(t, 'LX-4102')}/surveys` }),
  'GET /probes/:id/coefficient-sets': (t) => ({ path: `/api/probes/${probeIdBySerial(t, 'LX-4102')}/coefficient-sets` }),
  'POST /probes/:id/coefficient-sets': async (t) => ({ path: `/api/probes/${await freshProbe(t)}/coefficient-sets`, body: manualDraftBody(), okStatus: 201 }),
  'POST /coefficient-sets/:id/approve': async (t) => ({ path: `/api/coefficient-sets/${await colleagueDraft(t)}/approve` }),
  'DELETE /coefficient-sets/:id': async (t) => ({ path: `/api/coefficient-sets/${await colleagueDraft(t)}`, okStatus: 204 }),
  'POST /coefficient-sets/:id/certificate': async (t) => ({
    path: `/api/coefficient-sets/${await colleagueDraft(t)}/certificate`,
    files: { file: { content: TINY_PDF, filename: 'certificate.pdf', contentType: 'application/pdf' } },
  }),
  'GET /coefficient-sets/:id/certificate': async (t) => {
    const id = await colleagueDraft(t);
    const c2 = await t.signIn(DEMO.calibration2);
    await c2.post(`/api/coefficient-sets/${id}/certificate`).attach('file', TINY_PDF, 'certificate.pdf');
    await (await t.signIn(DEMO.calibration)).post(`/api/coefficient-sets/${id}/approve`);
    return { path: `/api/coefficient-sets/${id}/certificate` };
  },
  'POST /probes/:id/bench-runs': async (t) => ({ path: `/api/probes/${await freshProbe(t)}/bench-runs`, files: csvFile(), okStatus: 201 }),
  'GET /probes/:id/bench-runs': (t) => ({ path: `/api/probes/${probeIdBySerial(t, 'LX-4102')}/bench-runs` }),
  'GET /bench-runs/:id': async (t) => ({ path: `/api/bench-runs/${await benchRun(t)}` }),
  'GET /bench-runs/:id/file': async (t) => ({ path: `/api/bench-runs/${await benchRun(t)}/file` }),
  'GET /calibration/dashboard': () => ({ path: '/api/calibration/dashboard' }),
  'POST /calibration/reminders/run': () => ({ path: '/api/calibration/reminders/run' }),
};
