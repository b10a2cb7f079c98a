import { CAPABILITIES, CAPABILITY_LABELS, type Capability } from './policy';
import { ROLES, ROLE_LABELS } from './roles';

/** The role-by-capability table as Markdown; the README carries it and a test keeps them equal. */
export function roleTableMarkdown(): string {
  const head = `| capability | ${ROLES.map((r) => ROLE_LABELS[r]).join(' | ')} |`;
  const sep = `| --- | ${ROLES.map(() => ':---:').join(' | ')} |`;
  const rows = (Object.keys(CAPABILITIES) as Capability[]).map((k) =>
    `| ${CAPABILITY_LABELS[k]} (\`${k}\`) | ${ROLES.map((r) => ((CAPABILITIES[k] as readonly string[]).includes(r) ? 'yes' : '—')).join(' | ')} |`);
  return [head, sep, ...rows].join('\n');
}
