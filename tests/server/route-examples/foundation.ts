import type { RouteExamples } from './types';
import { DEMO } from '../helpers';

let n = 0;
const unique = () => `${Date.now().toString(36)}${(n++).toString(36)}`;

export const foundationExamples: RouteExamples = {
  'GET /health': () => ({ path: '/api/health' }),
  'POST /auth/login': () => ({ path: '/api/auth/login', body: { email: DEMO.calibration2, password: 'luxtrail-demo' } }),
  'POST /auth/logout': () => ({ path: '/api/auth/logout' }),
  'GET /auth/me': () => ({ path: '/api/auth/me' }),
  'GET /auth/session': () => ({ path: '/api/auth/session' }),
  'GET /auth/tokens': async (t) => {
    const admin = await t.signIn(DEMO.admin);
    await admin.post('/api/invitations').send({ email: `tok-${unique()}@luxtrail.test`, name: 'Token Holder', role: 'surveyor' });
    const token = /token=([^\s]+)/.exec(t.lastMail()!.text)![1];
    return { path: `/api/auth/tokens?token=${token}` };
  },
  'POST /auth/accept-invite': async (t) => {
    const admin = await t.signIn(DEMO.admin);
    await admin.post('/api/invitations').send({ email: `acc-${unique()}@luxtrail.test`, name: 'Accepting', role: 'surveyor' });
    const token = decodeURIComponent(/token=([^\s]+)/.exec(t.lastMail()!.text)![1]);
    return { path: '/api/auth/accept-invite', body: { token, password: 'long-enough-pw', confirmPassword: 'long-enough-pw' } };
  },
  'POST /auth/forgot-password': () => ({ path: '/api/auth/forgot-password', body: { email: DEMO.surveyor }, okStatus: 202 }),
  'POST /auth/reset-password': async (t) => {
    await t.client().post('/api/auth/forgot-password').send({ email: DEMO.calibration2 });
    const token = decodeURIComponent(/token=([^\s]+)/.exec(t.lastMail()!.text)![1]);
    return { path: '/api/auth/reset-password', body: { token, password: 'luxtrail-demo', confirmPassword: 'luxtrail-demo' } };
  },
  'GET /users': () => ({ path: '/api/users' }),
  'POST /invitations': () => ({ path: '/api/invitations', body: { email: `inv-${unique()}@luxtrail.test`, name: 'Invitee', role: 'surveyor' }, okStatus: 201 }),
  'POST /users/:id/invitation': async (t) => {
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post('/api/invitations').send({ email: `re-${unique()}@luxtrail.test`, name: 'Re-invitee', role: 'surveyor' });
    return { path: `/api/users/${res.body.id}/invitation`, okStatus: 202 };
  },
  'PATCH /users/:id': async (t) => {
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post('/api/invitations').send({ email: `pa-${unique()}@luxtrail.test`, name: 'Patched', role: 'surveyor' });
    return { path: `/api/users/${res.body.id}`, body: { name: 'Renamed Person' } };
  },
  'GET /outbox': () => ({ path: '/api/outbox' }),
  'GET /outbox/attachments/:id': async (t) => {
    t.deps.mailer.send({ to: 'x@luxtrail.test', subject: 'with attachment', text: 'see attached', organizationId: 1, attachments: [{ filename: 'a.txt', contentType: 'text/plain', content: Buffer.from('hello') }] });
    const admin = await t.signIn(DEMO.admin);
    const list = await admin.get('/api/outbox');
    return { path: `/api/outbox/attachments/${list.body.items[0].attachments[0].id}` };
  },
  'GET /audit': () => ({ path: '/api/audit' }),
};
