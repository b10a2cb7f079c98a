import { z } from 'zod';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';

export function registerHealthRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/health', access: 'public', tag: 'health', summary: 'Liveness and database check', response: z.object({ ok: z.boolean(), time: z.string() }) },
    () => {
      deps.db.$client.prepare('select 1').get();
      return { ok: true, time: new Date(deps.clock.now()).toISOString() };
    });
}
