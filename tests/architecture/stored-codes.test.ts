import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// Stored codes have one source: every text enum of the database schema takes its values from a
// constant of shared/ (SURVEY_STATUSES, LUX_BOUNDS, TOKEN_PURPOSES, ...), never a list typed there.
const schemaDir = path.resolve(__dirname, '../../server/db/schema');
const files = fs.readdirSync(schemaDir).filter((f) => f.endsWith('.ts'));

describe('database enums come from the shared constants', () => {
  it('finds the schema\'s enum columns (the check below is not vacuous)', () => {
    const enums = files.flatMap((f) => fs.readFileSync(path.join(schemaDir, f), 'utf8').match(/\{ enum: /g) ?? []);
    expect(enums.length).toBeGreaterThan(25);
  });

  it.each(files)('%s types no enum list of its own', (file) => {
    const text = fs.readFileSync(path.join(schemaDir, file), 'utf8');
    const typed = [...text.matchAll(/text\('(\w+)', \{ enum: \[/g)].map((m) => m[1]);
    expect(typed, `columns with a typed list in ${file}`).toEqual([]);
  });
});

// The import's threads used to be plain JavaScript with hand-written .d.mts types repeating the
// stored codes; they are TypeScript bundled at first use (import-runner.ts), one source for both.
describe('no hand-written JavaScript twins of TypeScript modules', () => {
  const walk = (dir: string): string[] => fs.readdirSync(dir, { withFileTypes: true })
    .flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
  it.each(['server', 'shared', 'src'])('%s/ holds no .mjs, .cjs, .js or .d.mts module', (dir) => {
    const root = path.resolve(__dirname, '../..', dir);
    const files = walk(root);
    expect(files.filter((f) => f.endsWith('.ts')).length).toBeGreaterThan(10);
    expect(files.filter((f) => /\.(mjs|cjs|js|d\.mts)$/.test(f)).map((f) => path.relative(root, f))).toEqual([]);
  });
});
