import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';

/**
 * The static import graph of the repository's own modules, resolved the way the compiler does
 * (tsconfig paths such as `@/`, `@server/`, `@shared/`). Type-only imports count too: a circle
 * through types still ties two modules together. Dynamic `import()` (lazy pages, workers) does not.
 */
export function importGraph(root: string, dirs: string[]): Map<string, string[]> {
  const configPath = ts.findConfigFile(root, ts.sys.fileExists, 'tsconfig.json');
  if (!configPath) throw new Error(`No tsconfig.json in ${root}`);
  const parsed = ts.parseJsonConfigFileContent(ts.readConfigFile(configPath, ts.sys.readFile).config, ts.sys, root);
  const options = { ...parsed.options, allowJs: true };
  const files = dirs.flatMap((d) => walk(path.join(root, d)));
  const inside = new Set(files);
  const graph = new Map<string, string[]>();
  for (const file of files) {
    const source = ts.createSourceFile(file, fs.readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, false);
    const deps = new Set<string>();
    for (const stmt of source.statements) {
      const spec = (ts.isImportDeclaration(stmt) || ts.isExportDeclaration(stmt)) && stmt.moduleSpecifier && ts.isStringLiteral(stmt.moduleSpecifier) ? stmt.moduleSpecifier.text : null;
      if (!spec) continue;
      const resolved = ts.resolveModuleName(spec, file, options, ts.sys).resolvedModule?.resolvedFileName;
      if (!resolved) continue;
      const target = path.resolve(resolved);
      if (inside.has(target)) deps.add(target);
    }
    graph.set(file, [...deps]);
  }
  return graph;
}

function walk(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return e.name === 'node_modules' ? [] : walk(p);
    return /\.(ts|tsx|mts|mjs)$/.test(e.name) && !/\.d\.mts$|\.d\.ts$/.test(e.name) ? [path.resolve(p)] : [];
  });
}

/** Strongly connected components with more than one module, or a module importing itself (Tarjan). */
export function importCircles(graph: Map<string, string[]>): string[][] {
  let index = 0;
  const idx = new Map<string, number>(), low = new Map<string, number>(), onStack = new Set<string>(), stack: string[] = [];
  const circles: string[][] = [];
  const visit = (v: string) => {
    idx.set(v, index); low.set(v, index); index++;
    stack.push(v); onStack.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!idx.has(w)) { visit(w); low.set(v, Math.min(low.get(v)!, low.get(w)!)); }
      else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const scc: string[] = [];
      let w: string;
      do { w = stack.pop()!; onStack.delete(w); scc.push(w); } while (w !== v);
      if (scc.length > 1 || (graph.get(v) ?? []).includes(v)) circles.push(scc.sort());
    }
  };
  for (const v of graph.keys()) if (!idx.has(v)) visit(v);
  return circles;
}
