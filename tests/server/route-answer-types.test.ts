import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { Api } from '@server/http/api';

// The route table types each handler's answer from its `response` schema. The routes marked
// below as expected errors must fail to compile: if the typing were lost, `npm run typecheck`
// would report each directive as unused.
describe('typed route answers', () => {
  it('declares routes whose handlers answer what their response schema says', () => {
    const api = new Api();
    const answer = z.object({ lux: z.number(), bound: z.enum(['exact', 'below']) });
    const base = { method: 'get', access: 'public', tag: 'test', summary: 'test' } as const;
    api.route({ ...base, path: '/right', response: answer }, () => ({ lux: 512.5, bound: 'exact' as const }));
    api.route({ ...base, path: '/right-async', response: answer }, async () => ({ lux: 0, bound: 'below' as const }));
    // @ts-expect-error lux as text where the schema says a number
    api.route({ ...base, path: '/wrong-type', response: answer }, () => ({ lux: '512.5', bound: 'exact' as const }));
    // @ts-expect-error the bound is missing
    api.route({ ...base, path: '/missing-field', response: answer }, async () => ({ lux: 1 }));
    // @ts-expect-error an answer without a response schema documenting it
    api.route({ ...base, path: '/undocumented' }, () => ({ lux: 1 }));
    api.route({ ...base, path: '/no-content', method: 'post' }, () => undefined);
    expect(api.routes.map((r) => r.path)).toEqual(['/right', '/right-async', '/wrong-type', '/missing-field', '/undocumented', '/no-content']);
  });
});
