import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { importCircles, importGraph } from './import-graph';

const root = path.resolve(__dirname, '../..');
const graph = importGraph(root, ['src', 'server', 'shared']);
const rel = (f: string) => path.relative(root, f);

/** A server module (server/modules/<name>) or client feature (src/features/<name>) as one node; any other file as itself. */
const unitOf = (file: string) => rel(file).match(/^(server\/modules\/[^/]+|src\/features\/[^/]+)/)?.[1] ?? rel(file);

describe('import circles', () => {
  it('finds the repository\'s modules and their imports (the check below is not vacuous)', () => {
    expect(graph.size).toBeGreaterThan(250);
    expect(graph.get(path.join(root, 'server/app.ts'))?.map(rel)).toContain('server/modules.ts');
    // The resolver follows tsconfig paths: the client's @shared import reaches shared/.
    expect(graph.get(path.join(root, 'src/app/nav.ts'))?.map(rel)).toContain('shared/paths.ts');
  });

  it('reports a circle when there is one (the detector works)', () => {
    const g = new Map([['a', ['b']], ['b', ['c']], ['c', ['a']], ['d', ['a']], ['e', ['e']]]);
    expect(importCircles(g).map((c) => c.join(' '))).toEqual(expect.arrayContaining(['a b c', 'e']));
    expect(importCircles(new Map([['a', ['b']], ['b', []]]))).toEqual([]);
  });

  it('has no import circle between files of src/, server/ and shared/', () => {
    expect(importCircles(graph).map((c) => c.map(rel).join(' → '))).toEqual([]);
  });

  it('has no import circle between server modules or client features', () => {
    const units = new Map<string, Set<string>>();
    for (const [file, deps] of graph) {
      const u = unitOf(file);
      if (!units.has(u)) units.set(u, new Set());
      for (const d of deps) if (unitOf(d) !== u) units.get(u)!.add(unitOf(d));
    }
    expect(importCircles(new Map([...units].map(([u, d]) => [u, [...d]])))).toEqual([]);
  });
});
