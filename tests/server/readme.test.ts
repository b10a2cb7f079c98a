import { describe, it, expect } from 'vitest';
import fs from 'node:fs';
import { roleTableMarkdown } from '@shared/policy-table';

const readme = fs.readFileSync('README.md', 'utf8');
const pkg = JSON.parse(fs.readFileSync('package.json', 'utf8')) as { scripts: Record<string, string> };

describe('README stays true', () => {
  it('carries the role-by-capability table exactly as shared/policy.ts decides it', () => {
    expect(readme).toContain(roleTableMarkdown());
  });

  it('names only npm scripts that package.json defines', () => {
    const named = [...readme.matchAll(/npm run ([a-z0-9:_-]+)/g)].map((m) => m[1]);
    expect(named.length).toBeGreaterThan(0);
    for (const s of named) expect(pkg.scripts[s], `npm run ${s}`).toBeTruthy();
  });
});
