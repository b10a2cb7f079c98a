// First-load benchmark (`npm run bench:bundle`, after `vite build`). Prints figures; fails only
// when the first load is over its budget. Reads Vite's manifest (dist/.vite/manifest.json) and
// sums, gzip -9, the JavaScript a browser must fetch before a page can paint: the entry script
// with its static imports, plus the page's lazy route chunk with its own static imports.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

type Chunk = { file: string; src?: string; name?: string; isEntry?: boolean; isDynamicEntry?: boolean; imports?: string[]; dynamicImports?: string[] };

/** Budget for the entry plus the sign-in page (issue #11: at most 200 KB gzip before the first paint). */
const FIRST_LOAD_BUDGET_KB = 200;
/** Budget for the field view's own route code beyond the entry (issue #14: at most 150 KB gzip). */
const FIELD_BUDGET_KB = 150;
const dist = path.resolve(process.argv[2] ?? 'dist');
const manifestPath = path.join(dist, '.vite', 'manifest.json');
if (!fs.existsSync(manifestPath)) {
  console.error(`No ${manifestPath}: run \`vite build\` first.`);
  process.exit(2);
}
const manifest = JSON.parse(fs.readFileSync(manifestPath, 'utf8')) as Record<string, Chunk>;

const gzipCache = new Map<string, { raw: number; gz: number }>();
function size(file: string) {
  let s = gzipCache.get(file);
  if (!s) {
    const buf = fs.readFileSync(path.join(dist, file));
    s = { raw: buf.length, gz: zlib.gzipSync(buf, { level: 9 }).length };
    gzipCache.set(file, s);
  }
  return s;
}

/** A chunk and everything it imports statically (what the browser fetches with it). */
function closure(key: string, seen = new Set<string>()): Set<string> {
  if (seen.has(key)) return seen;
  seen.add(key);
  for (const dep of manifest[key]?.imports ?? []) closure(dep, seen);
  return seen;
}
const total = (keys: Iterable<string>) => {
  let raw = 0, gz = 0;
  for (const k of keys) { const s = size(manifest[k]!.file); raw += s.raw; gz += s.gz; }
  return { raw, gz };
};
const kb = (n: number) => (n / 1024).toFixed(1).padStart(7);

const entryKey = Object.keys(manifest).find((k) => manifest[k]!.isEntry);
if (!entryKey) throw new Error('The manifest has no entry chunk');
const entry = closure(entryKey);
const entrySize = total(entry);
const pages = Object.keys(manifest).filter((k) => manifest[k]!.isDynamicEntry && /src\/app\/routes\//.test(k)).sort();

console.log('JavaScript before a page can paint (KB; gzip -9):');
console.log(`${'raw'.padStart(7)} ${'gzip'.padStart(7)}  what`);
console.log(`${kb(entrySize.raw)} ${kb(entrySize.gz)}  entry + static imports (${entry.size} files: router, providers, shell)`);
let signInGz = Number.NaN;
const rows: string[] = [];
for (const key of pages) {
  const own = [...closure(key)].filter((k) => !entry.has(k));
  const ownSize = total(own);
  const first = entrySize.gz + ownSize.gz;
  if (key.endsWith('routes/auth/sign-in.tsx')) signInGz = first;
  rows.push(`${kb(ownSize.raw)} ${kb(ownSize.gz)}  + ${key.replace(/^src\/app\/routes\//, '').replace(/\.tsx$/, '')} (first load with entry ${kb(first).trim()} KB)`);
}
console.log('Each page\'s own chunk with its static imports beyond the entry:');
for (const r of rows) console.log(r);
const ok = signInGz <= FIRST_LOAD_BUDGET_KB * 1024;
console.log(`Before the sign-in page paints: ${kb(signInGz).trim()} KB gzip (budget ${FIRST_LOAD_BUDGET_KB} KB): ${ok ? 'within budget' : 'OVER BUDGET'}`);

// The field view (its frame, survey list and survey page, with everything they import beyond the
// entry): what a phone fetches to open it, at most FIELD_BUDGET_KB gzip beyond the shell (issue #14).
const fieldKeys = pages.filter((k) => /src\/app\/routes\/field\//.test(k));
const fieldOwn = new Set(fieldKeys.flatMap((k) => [...closure(k)]).filter((k) => !entry.has(k)));
const fieldSize = total(fieldOwn);
const fieldOk = fieldKeys.length > 0 && fieldSize.gz <= FIELD_BUDGET_KB * 1024;
console.log(`Field view's own JavaScript beyond the shell (${fieldKeys.length} route chunks, ${fieldOwn.size} files): ${kb(fieldSize.raw).trim()} KB raw, ${kb(fieldSize.gz).trim()} KB gzip (budget ${FIELD_BUDGET_KB} KB): ${fieldOk ? 'within budget' : 'OVER BUDGET'}`);
if (!ok || !fieldOk) process.exit(1);
