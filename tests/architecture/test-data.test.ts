import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// Server tests take their data from one module, tests/server/support/factories.ts, whose builders
// create the parents a record needs; a test that writes rows itself grows a second chain to keep.
const serverTests = path.resolve(__dirname, '../server');
const factories = path.join(serverTests, 'support', 'factories.ts');
const walk = (dir: string): string[] => fs.readdirSync(dir, { withFileTypes: true })
  .flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : e.name.endsWith('.ts') ? [path.join(dir, e.name)] : []));

describe('server test data comes from the one factory module', () => {
  it('the factory module itself writes rows (the check below is not vacuous)', () => {
    expect(fs.readFileSync(factories, 'utf8').match(/\.insert\(/g)?.length ?? 0).toBeGreaterThan(5);
  });

  it('no other server test file inserts rows directly', () => {
    const offenders = walk(serverTests).filter((f) => f !== factories)
      .filter((f) => /\bdb\s*\.\s*insert\(/.test(fs.readFileSync(f, 'utf8')))
      .map((f) => path.relative(serverTests, f));
    expect(offenders).toEqual([]);
  });
});
