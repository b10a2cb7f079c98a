import fs from 'node:fs';
import { roleTableMarkdown } from '@shared/policy-table';

/** `npm run docs:roles`: rewrites the README's role table from shared/policy.ts. */
const START = '<!-- role-table:start -->';
const END = '<!-- role-table:end -->';
const readme = fs.readFileSync('README.md', 'utf8');
const a = readme.indexOf(START);
const b = readme.indexOf(END);
if (a < 0 || b < a) throw new Error(`README.md lacks the ${START} … ${END} markers`);
fs.writeFileSync('README.md', `${readme.slice(0, a + START.length)}\n${roleTableMarkdown()}\n${readme.slice(b)}`);
console.log('README.md role table updated from shared/policy.ts');
