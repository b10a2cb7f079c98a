import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { describe, it, expect, afterAll } from 'vitest';
import { schema, type Db } from '@server/db/client';
import { createBatchBuilder, fillReadingValues, unpackF64Block, PLANE_SAMPLE_WIDTH, READING_WIDTH, SAMPLE_WIDTH } from '@server/modules/imports/batch-format';
import { pagesOfSamples, unpackSampleBlock } from '@server/modules/imports/sample-blocks';
import type { DecodedReading, LogSample } from '@server/modules/imports/log-decoder';
import { encodeBudget } from '@server/modules/readings/stored-budget';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-blocks-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const sample = (over: Partial<LogSample>): LogSample => ({
  line: 2, timeMs: Date.parse('2026-11-20T09:00:00.125Z'), probe: 'P', point: 'A1', gainCode: 3, counts: 41_873,
  intMs: 100, tempC: 21.5, xM: 29.78, yM: 0.1 + 0.2, planId: 4, role: 'task', note: null, ...over,
});

describe('batch format: how accepted rows travel between threads and are kept', () => {
  it('samples, through a batch and a stored block, come back value for value (nulls, text, role, 17 significant digits)', () => {
    const b = createBatchBuilder(1);
    const input = [
      sample({}),
      sample({ line: 3, point: '=SUM(A1:A9)', gainCode: undefined, counts: undefined, ma: 12.345678901234567, intMs: undefined, tempC: -4.25, xM: null, yM: null, planId: null, role: 'reference', note: 'Café "north" door, ajar' }),
      sample({ line: 4, point: 'A1', volts: 0, counts: 0, note: 'Café "north" door, ajar', plane: 'vertical', azimuthDeg: 270 }),
    ];
    input.forEach((s, i) => b.addSample(s, 10 + i));
    const batch = b.take();
    expect(batch.sampleRows).toBe(3);
    expect(batch.samples).toHaveLength(3 * PLANE_SAMPLE_WIDTH);
    // Each distinct text once: A1, the formula-like label, the note.
    expect(batch.strings).toEqual(['A1', '=SUM(A1:A9)', 'Café "north" door, ajar']);
    const back = unpackF64Block(new Uint8Array(batch.samples.buffer), batch.strings, 3, 'f64p');
    expect(back).toEqual(input.map((s, i) => ({
      line: s.line, timeMs: s.timeMs, probeId: 10 + i, point: s.point, gainCode: s.gainCode ?? null, counts: s.counts ?? null, ma: s.ma ?? null, volts: s.volts ?? null,
      intMs: s.intMs ?? null, tempC: s.tempC ?? null, xM: s.xM, yM: s.yM, planId: s.planId, role: s.role, note: s.note, plane: s.plane ?? 'horizontal', azimuthDeg: s.azimuthDeg ?? null,
    })));
    // The builder starts empty after take().
    expect(b.take()).toMatchObject({ sampleRows: 0, readingRows: 0, strings: [] });
  });

  it('readings, through a batch, become the readings insert\'s values in its column order, nulls for nothing, the budget as encodeBudget stores it', () => {
    const b = createBatchBuilder();
    const counting = [{ name: 'calibration', uRel: 0.021 }, { name: 'quantisation', uRel: 0.000123456789012345 }, { name: 'dark_offset', uRel: 0.0031 }, { name: 'temperature', uRel: 0.0047 }] as const;
    const analog = [{ name: 'calibration', uRel: 0.015 }, { name: 'transmitter', uRel: 0.0025 }] as const;
    const r: DecodedReading = {
      probeId: 7, point: 'C-3', xM: 12.5, yM: 8, planId: null, role: 'task', note: 'under the stair', timeMs: 1_795_000_000_123,
      lux: null, uLux: null, luxBound: 'lower', flag: 'over_range', gainCode: 0, samples: 4, chosenSample: null, coefficientSetId: 3, budget: [...counting],
      rawCounts: 65535, rawSignal: null, intMs: 50, tempC: null,
    };
    b.addReading(r);
    b.addReading({ ...r, point: 'C-4', lux: 512.25, uLux: 20.5, luxBound: 'exact', flag: 'ok', gainCode: null, chosenSample: 2, note: null, budget: [...analog, { name: 'temperature', uRel: Number.NaN }], plane: 'vertical', azimuthDeg: 90, rawCounts: null, rawSignal: 11.875, intMs: null, tempC: 21.5 });
    const batch = b.take();
    expect(batch.readings).toHaveLength(2 * READING_WIDTH);
    const out: unknown[] = [];
    expect(fillReadingValues(batch, 0, 2, out)).toBe(46);
    expect(out.slice(0, 23)).toEqual(['C-3', 12.5, 8, null, 'task', 1_795_000_000_123, 7, null, null, 'lower', 'over_range', 0, 4, null, 3, encodeBudget(counting), 'under the stair', 'horizontal', null, 65535, null, 50, null]);
    expect(out.slice(23)).toEqual(['C-4', 12.5, 8, null, 'task', 1_795_000_000_123, 7, 512.25, 20.5, 'exact', 'ok', null, 4, 2, 3, encodeBudget(analog), null, 'vertical', 90, null, 11.875, null, 21.5]);
  });

  it('refuses what it cannot carry: an unknown role, flag or budget part', () => {
    const b = createBatchBuilder();
    expect(() => b.addSample(sample({ role: 'ceiling' as never }), 1)).toThrow(/unknown role "ceiling"/);
    const r = { probeId: 1, point: 'A', xM: null, yM: null, planId: null, role: 'task', note: null, timeMs: 0, lux: 1, uLux: 0.1, luxBound: 'exact', flag: 'dim', gainCode: 1, samples: 1, chosenSample: 0, coefficientSetId: 1, budget: [] };
    expect(() => b.addReading(r as never)).toThrow(/unknown flag "dim"/);
    expect(() => b.addReading({ ...r, flag: 'ok', budget: [{ name: 'wind', uRel: 0.1 }] } as never)).toThrow(/unknown budget part "wind"/);
  });

  it('a block written before planes (encoding f64, 15 numbers a sample) still reads back, as horizontal readings', () => {
    const b = createBatchBuilder();
    b.addSample(sample({}), 9);
    const batch = b.take();
    // The earlier layout is the new one without its last two slots (plane, azimuth).
    const old = new Float64Array(SAMPLE_WIDTH);
    old.set(batch.samples.subarray(0, SAMPLE_WIDTH));
    const back = unpackSampleBlock({ id: 7, rowCount: 1, encoding: 'f64', strings: JSON.stringify(batch.strings), data: Buffer.from(old.buffer) });
    expect(back).toEqual([expect.objectContaining({ point: 'A1', probeId: 9, counts: 41_873, plane: 'horizontal', azimuthDeg: null })]);
  });

  it('a damaged block fails naming the block and what is wrong, never returning made-up samples', () => {
    const b = createBatchBuilder();
    b.addSample(sample({}), 1);
    const batch = b.take();
    const data = Buffer.from(batch.samples.buffer);
    expect(() => unpackSampleBlock({ id: 41, rowCount: 2, encoding: 'f64p', strings: '["A1"]', data })).toThrow(/Sample block 41 is damaged: it holds 136 bytes, not 2 samples of 17 numbers/);
    // Read with the layout of before planes, the same bytes do not fit.
    expect(() => unpackSampleBlock({ id: 40, rowCount: 1, encoding: 'f64', strings: '["A1"]', data })).toThrow(/Sample block 40 is damaged: it holds 136 bytes, not 1 samples of 15 numbers/);
    expect(() => unpackSampleBlock({ id: 42, rowCount: 1, encoding: 'f64p', strings: '[]', data })).toThrow(/Sample block 42 is damaged: it gives sample 0 a text, role or plane it does not hold/);
    expect(() => unpackSampleBlock({ id: 43, rowCount: 1, encoding: 'f64p', strings: null, data })).toThrow(/Sample block 43 is damaged: it has no string table/);
    expect(() => unpackSampleBlock({ id: 44, rowCount: 2, encoding: 'json', strings: null, data: Buffer.from('[1,2,3]') })).toThrow(/Sample block 44 is damaged: it does not hold 2 samples of 15 values/);
  });
});

describe('migration 0003: samples kept one row each before it are moved into blocks, nothing lost', () => {
  it('moves every sample of every import into blocks of 1,024 in file order, and the rows read back as they were', () => {
    // The migrations before 0003, then the one-row-per-sample table filled as an earlier release did.
    const all = path.resolve('drizzle');
    const before = path.join(dir, 'drizzle-0002');
    fs.mkdirSync(path.join(before, 'meta'), { recursive: true });
    const journal = JSON.parse(fs.readFileSync(path.join(all, 'meta/_journal.json'), 'utf8')) as { entries: { tag: string }[] };
    const early = journal.entries.filter((e) => /^000[0-2]_/.test(e.tag));
    fs.writeFileSync(path.join(before, 'meta/_journal.json'), JSON.stringify({ ...journal, entries: early }));
    for (const e of early) fs.copyFileSync(path.join(all, `${e.tag}.sql`), path.join(before, `${e.tag}.sql`));
    const sqlite = new Database(path.join(dir, 'migrate.db'));
    const db = drizzle(sqlite, { schema }) as unknown as Db;
    migrate(db, { migrationsFolder: before });
    sqlite.pragma('foreign_keys = OFF');
    const insert = sqlite.prepare('insert into samples (import_id, survey_id, line, time_ms, probe_id, point, gain_code, counts, ma, volts, int_ms, temp_c, x_m, y_m, plan_id, role, note) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)');
    type Row = [number, number, number, number, number, string, number | null, number | null, number | null, number | null, number | null, number | null, number | null, number | null, number | null, string, string | null];
    const rows: Row[] = [];
    // Import 5: 2,500 counting samples (three blocks); import 6: three analog ones with text that needs escaping.
    for (let i = 0; i < 2500; i++) rows.push([5, 1, i + 2, 1_795_000_000_000 + i * 400, 1, `P${Math.floor(i / 4)}`, i % 4, 1000 + i, null, null, 100, 21.5, 29.78, 0.30000000000000004, 2, 'task', null]);
    rows.push([6, 2, 2, 1_795_000_000_000, 3, 'Ramp "B"', null, null, 12.5, null, null, null, null, null, null, 'reference', 'line one,\nline two']);
    rows.push([6, 2, 3, 1_795_000_000_500, 3, '=HYPERLINK("x")', null, null, 3.7, null, null, -2, 1e-7, 123456.789, null, 'task', 'Über']);
    rows.push([6, 2, 4, 1_795_000_001_000, 3, 'Ramp "B"', null, null, 20.75, null, null, null, 0, 0, null, 'task', null]);
    sqlite.transaction(() => { for (const r of rows) insert.run(...r); })();

    migrate(db, { migrationsFolder: all });
    expect(sqlite.prepare("select count(*) as n from sqlite_master where name = 'samples'").get()).toEqual({ n: 0 });
    const blocks = sqlite.prepare('select import_id as importId, first_line as firstLine, row_count as rowCount, encoding from sample_blocks order by id').all();
    expect(blocks).toEqual([
      { importId: 5, firstLine: 2, rowCount: 1024, encoding: 'json' }, { importId: 5, firstLine: 1026, rowCount: 1024, encoding: 'json' },
      { importId: 5, firstLine: 2050, rowCount: 452, encoding: 'json' }, { importId: 6, firstLine: 2, rowCount: 3, encoding: 'json' },
    ]);
    const kept = [5, 6].flatMap((importId) => [...pagesOfSamples(db, importId)].flat());
    expect(kept).toEqual(rows.map((r) => ({
      line: r[2], timeMs: r[3], probeId: r[4], point: r[5], gainCode: r[6], counts: r[7], ma: r[8], volts: r[9], intMs: r[10], tempC: r[11], xM: r[12], yM: r[13], planId: r[14], role: r[15], note: r[16], plane: 'horizontal', azimuthDeg: null,
    })));
    sqlite.close();
  });
});
