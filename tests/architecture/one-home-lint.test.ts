import path from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

// The lint rules that keep query keys in src/lib/query-keys.ts and paths in shared/paths.ts
// (eslint.config.js), run on snippets: each hand-spelled key or path is refused, the sanctioned
// forms pass. `npm run lint` applies the same rules to the whole repository.
const eslint = new ESLint({ cwd: path.resolve(__dirname, '../..') });

async function restricted(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.ruleId === 'no-restricted-syntax').map((m) => m.message);
}

const CLIENT_FILE = 'src/features/surveys/components/lint-probe.tsx';

describe('query keys are never spelled by hand', () => {
  it.each([
    ["queryOptions({ queryKey: ['surveys', id], queryFn })", 'queryOptions'],
    ["qc.invalidateQueries({ queryKey: ['surveys'] })", 'invalidation'],
    ["qc.setQueryData(['surveys', id], data)", 'setQueryData with an array'],
    ['qc.invalidateQueries({ queryKey: q.queryKey.slice(0, 1) })', 'a cut key'],
  ])('refuses %s (%s)', async (code) => {
    expect(await restricted(`${code};\n`, CLIENT_FILE)).toEqual([expect.stringContaining('query-keys')]);
  });

  it('accepts keys from the key objects, and allows arrays in query-keys.ts itself', async () => {
    expect(await restricted('qc.invalidateQueries({ queryKey: surveyKeys.detail(id) });\nqueryOptions({ queryKey: surveyKeys.lists(), queryFn });\n', CLIENT_FILE)).toEqual([]);
    expect(await restricted("export const k = { all: ['surveys'] as const, x: () => queryOptions({ queryKey: ['surveys', 1] }) };\n", 'src/lib/query-keys.ts')).toEqual([]);
  });
});

describe('page paths and served files are never spelled by hand', () => {
  it.each([
    ['<Link to="/surveys">Surveys</Link>', 'a literal link'],
    ['<Link to={`/surveys/${id}`}>Survey</Link>', 'a template link'],
    ['<a href={"/compliance"}>Verdicts</a>', 'a literal in braces'],
    ['<a href={`/api/surveys/${id}/report.pdf`}>PDF</a>', 'a served file in a link'],
  ])('refuses %s (%s)', async (jsx) => {
    expect(await restricted(`export const x = ${jsx};\n`, CLIENT_FILE)).not.toEqual([]);
  });

  it.each([
    ["navigate('/surveys')", 'navigate'],
    ['navigate(`/surveys/${id}`)', 'navigate with a template'],
    ["const u = '/api/outbox/attachments/' + id", 'a served file as a string'],
  ])('refuses %s (%s)', async (code) => {
    expect(await restricted(`${code};\n`, CLIENT_FILE)).not.toEqual([]);
  });

  it('accepts paths and apiFiles, and the sample files in public/', async () => {
    const ok = 'export const x = <><Link to={paths.survey.to(id)}>S</Link><a href={apiFiles.walkSheetPdf(id)}>W</a><a href="/samples/library-walk.csv">Sample</a></>;\nnavigate(paths.surveys.to());\n';
    expect(await restricted(ok, CLIENT_FILE)).toEqual([]);
  });

  it('refuses a hand-built e-mail link on the server, and accepts route declarations and paths', async () => {
    const file = 'server/modules/workflow/lint-probe.ts';
    expect(await restricted('export const text = `Open it: ${publicUrl}/compliance/surveys/${id}`;\n', file)).toHaveLength(1);
    expect(await restricted('export const link = `/compliance/surveys/${id}`;\n', file)).toHaveLength(1);
    expect(await restricted("export const u = '/api/plans/' + id + '/image';\n", file)).not.toEqual([]);
    expect(await restricted("api.route({ method: 'get', path: '/surveys/:id' }, h);\nconst link = absoluteUrl(publicUrl, paths.surveyCompliance.to(id));\n", file)).toEqual([]);
  });
});

describe('dates are formatted in one place', () => {
  it.each([
    ["new Date(iso).toLocaleDateString('en-GB')", 'toLocaleDateString'],
    ["new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' }).format(d)", 'a formatter of its own'],
  ])('refuses %s (%s) in the client', async (code) => {
    expect(await restricted(`export const x = ${code};\n`, CLIENT_FILE)).toEqual([expect.stringContaining('shared/datetime.ts')]);
  });

  it('accepts the shared formatters', async () => {
    expect(await restricted("export const x = formatDateTime(iso, zone, { seconds: true }) + formatCalendarDay('2026-12-02');\n", CLIENT_FILE)).toEqual([]);
  });
});
