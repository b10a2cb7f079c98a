import { describe, it, expect } from 'vitest';
import { connectDatabase, KEPT_STATEMENTS } from '@server/db/client';

// Each connection keeps its prepared statements by SQL text (server/db/client.ts): a kept one must
// behave exactly as a freshly prepared one, whatever mode its last caller left it in.
function database() {
  const db = connectDatabase(':memory:');
  db.$client.exec('create table t (id integer primary key, v text); insert into t (v) values (\'a\'), (\'b\'), (\'c\')');
  return db.$client;
}

describe('kept prepared statements', () => {
  it('the same SQL gives the kept statement, back in object mode after a caller set raw or pluck', () => {
    const sqlite = database();
    const first = sqlite.prepare('select id, v from t order by id');
    expect(first.raw().all()).toEqual([[1, 'a'], [2, 'b'], [3, 'c']]);
    const again = sqlite.prepare('select id, v from t order by id');
    expect(again).toBe(first);
    expect(again.all()).toEqual([{ id: 1, v: 'a' }, { id: 2, v: 'b' }, { id: 3, v: 'c' }]);
    sqlite.prepare('select id, v from t order by id').pluck();
    expect(sqlite.prepare('select id, v from t order by id').get()).toEqual({ id: 1, v: 'a' });
    // Statements that return no rows are kept too.
    const insert = sqlite.prepare('insert into t (v) values (?)');
    expect(sqlite.prepare('insert into t (v) values (?)')).toBe(insert);
    expect(insert.run('d').changes).toBe(1);
  });

  it('a statement mid-iteration is not shared: the same query nested inside it runs on its own statement', () => {
    const sqlite = database();
    const pairs: string[] = [];
    for (const outer of sqlite.prepare('select v from t order by id').iterate() as IterableIterator<{ v: string }>) {
      for (const inner of sqlite.prepare('select v from t order by id').iterate() as IterableIterator<{ v: string }>) pairs.push(outer.v + inner.v);
    }
    expect(pairs).toEqual(['aa', 'ab', 'ac', 'ba', 'bb', 'bc', 'ca', 'cb', 'cc']);
  });

  it('keeps at most KEPT_STATEMENTS, the least recently used first out', () => {
    const sqlite = database();
    const oldest = sqlite.prepare('select 0 as n');
    const recent = sqlite.prepare('select 1 as n');
    for (let i = 2; i < KEPT_STATEMENTS + 1; i++) {
      sqlite.prepare(`select ${i} as n`);
      // Used again, so it is not the oldest when the cache is full.
      if (i === KEPT_STATEMENTS - 10) expect(sqlite.prepare('select 1 as n')).toBe(recent);
    }
    expect(sqlite.prepare('select 1 as n')).toBe(recent);
    const replaced = sqlite.prepare('select 0 as n');
    expect(replaced).not.toBe(oldest);
    expect(replaced.get()).toEqual({ n: 0 });
  });
});
