import { describe, expect, it } from 'vitest';
import zlib from 'node:zlib';
import type { Request, Response } from 'express';
import { packedAnswer, packJsonField } from '@server/http/packed-json';

/** Sends the answer into a stand-in response and gives back the body and headers as a client would receive them. */
async function sent(answer: ReturnType<typeof packedAnswer>, encoding: 'gzip' | 'identity') {
  const pieces: Uint8Array[] = [];
  const headers: Record<string, string | number> = {};
  const res = {
    status: () => res, type: () => res, vary: () => res, cork: () => undefined,
    setHeader: (k: string, v: string | number) => { headers[k.toLowerCase()] = v; },
    write: (b: Uint8Array) => { pieces.push(b); },
    end: () => undefined,
  };
  await answer.send({ acceptsEncodings: () => encoding } as unknown as Request, res as unknown as Response, 200);
  const body = Buffer.concat(pieces);
  expect(headers['content-length']).toBe(body.length);
  return { text: headers['content-encoding'] === 'gzip' ? zlib.gunzipSync(body).toString() : body.toString(), headers };
}

describe('packed JSON answers', () => {
  const points = (n: number) => Array.from({ length: n }, (_, i) => ({ readingId: i, point: `P${i}`, lux: 500 + (i % 17) / 3 }));
  // Rest sizes around one stored block (65,535 bytes) and beyond two, with characters of two and three bytes.
  for (const n of [0, 1, 5000]) {
    for (const restChars of [0, 10, 65_530, 140_000]) {
      it(`${n} points and ${restChars} characters of other fields: gzip and plain both give the whole answer's JSON`, async () => {
        const rest: Record<string, unknown> = restChars === 0 ? {} : { note: 'x'.repeat(restChars), unit: 'é€', count: 3 };
        const answer = packedAnswer(packJsonField('points', points(n)), rest);
        const expected = JSON.stringify({ points: points(n), ...rest });
        const gzip = await sent(answer, 'gzip');
        expect(gzip.headers['content-encoding']).toBe('gzip');
        expect(gzip.text).toBe(expected);
        const plain = await sent(answer, 'identity');
        expect(plain.headers['content-encoding']).toBeUndefined();
        expect(plain.text).toBe(expected);
      });
    }
  }

  it('keeps less than a third of the JSON for thousands of points (the bytes the answer cache counts)', () => {
    const packed = packJsonField('points', points(5000));
    expect(packed.length).toBe(JSON.stringify({ points: points(5000) }).length - 1);
    expect(packed.deflated.byteLength).toBeLessThan(packed.length / 3);
  });
});
