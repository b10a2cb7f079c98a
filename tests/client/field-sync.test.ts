import { describe, it, expect, vi, beforeEach } from 'vitest';
import type { OutboxItem } from '@/features/field/offline/field-db';

// The phone's outbox and the server, in memory: which items the pass sends, keeps or marks refused.
const store = vi.hoisted(() => ({ items: [] as { key: string; state: string; reason?: string | null }[], answers: [] as (() => Promise<unknown>)[] }));
vi.mock('@/features/field/offline/field-db', () => ({
  outboxItems: async () => store.items.map((i) => ({ ...i })),
  removeItem: async (key: string) => { store.items = store.items.filter((i) => i.key !== key); },
  markRefused: async (key: string, reason: string) => { const i = store.items.find((x) => x.key === key)!; i.state = 'refused'; i.reason = reason; },
}));
vi.mock('@/lib/api-client', async (importOriginal) => {
  const real = await importOriginal<typeof import('@/lib/api-client')>();
  return { ...real, api: { ...real.api, post: () => store.answers.shift()!() } };
});

const { syncOutbox, retryDelayMs } = await import('@/features/field/offline/sync');
const { ApiRequestError } = await import('@/lib/api-client');

const record = (key: string): OutboxItem => ({ key, state: 'waiting', kind: 'record', surveyId: 1, body: {} as never, reason: null, createdAt: 0 });
const ok = () => Promise.resolve({});
const fail = (status: number) => () => Promise.reject(new ApiRequestError(status, 'x', `answered ${status}`));

describe('field outbox sync', () => {
  beforeEach(() => { store.items = []; store.answers = []; });

  it('sends in order, keeps a refused item with its reason, and stops at an unreachable server with the rest still waiting', async () => {
    store.items = ['a', 'b', 'c', 'd'].map(record);
    store.answers = [ok, fail(422), fail(0)];
    const out = await syncOutbox();
    expect(out).toEqual({ sent: 1, refused: 1, stopped: 'unreachable' });
    expect(store.items.map((i) => [i.key, i.state])).toEqual([['b', 'refused'], ['c', 'waiting'], ['d', 'waiting']]);
    expect(store.items[0].reason).toBe('answered 422');
  });

  it('waits (does not refuse) on a server fault, a lapsed sign-in or a request to slow down', async () => {
    for (const status of [500, 503, 401, 429]) {
      store.items = [record('a')];
      store.answers = [fail(status)];
      expect(await syncOutbox()).toEqual({ sent: 0, refused: 0, stopped: 'server' });
      expect(store.items[0].state).toBe('waiting');
    }
  });

  it('tries again after 2 s, doubling to at most a minute', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 20].map(retryDelayMs)).toEqual([2_000, 4_000, 8_000, 16_000, 32_000, 60_000, 60_000, 60_000]);
  });
});
