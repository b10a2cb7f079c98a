/**
 * Audit events in the words people read elsewhere in Luxtrail ("sent the report of survey
 * “Autumn walk-through” (#5)"), never the stored codes (report_sent, log_import).
 */
const ENTITY_NAMES: Record<string, string> = {
  probe: 'probe', coefficient_set: 'coefficient set', bench_run: 'bench run', user: 'user', survey: 'survey', log_import: 'meter log',
  plan: 'plan', site: 'site', target: 'target entry', zone: 'zone', organization: 'organisation',
};

const ACTION_PHRASES: Record<string, (what: string) => string> = {
  created: (w) => `created ${w}`,
  updated: (w) => `changed ${w}`,
  deleted: (w) => `deleted ${w}`,
  approved: (w) => `approved ${w}`,
  discarded: (w) => `discarded ${w}`,
  drafted: (w) => `drafted ${w}`,
  certificate_attached: (w) => `attached a certificate to ${w}`,
  decision_rule_changed: (w) => `changed the decision rule of ${w}`,
  image_replaced: (w) => `replaced the image of ${w}`,
  imported: (w) => `imported ${w}`,
  invited: (w) => `invited ${w}`,
  redecoded: (w) => `re-decoded ${w}`,
  report_sent: (w) => `sent the report of ${w}`,
  returned: (w) => `returned ${w} for changes`,
  signed_off: (w) => `signed off ${w}`,
  submitted: (w) => `submitted ${w} for review`,
  target_chosen: (w) => `chose the target of ${w}`,
  uploaded: (w) => `uploaded ${w}`,
  scale_set: (w) => `set the scale of ${w}`,
};

/** A file's name names a file record only (a sent report's filename is not the survey's name). */
const nameIn = (v: unknown, entityType: string): string | null => {
  if (typeof v !== 'object' || v === null) return null;
  const o = v as Record<string, unknown>;
  const keys = entityType === 'bench_run' || entityType === 'log_import' ? ['filename', 'name'] : ['name', 'serial', 'email'];
  for (const k of keys) if (typeof o[k] === 'string' && o[k]) return o[k] as string;
  return null;
};

/** The record an event concerns: "survey “Autumn walk-through” (#5)" or "meter log #12". */
export function describeAuditRecord(e: { entityType: string; entityId: number; before?: unknown; after?: unknown }): string {
  const kind = ENTITY_NAMES[e.entityType] ?? e.entityType.replace(/_/g, ' ');
  const name = nameIn(e.after, e.entityType) ?? nameIn(e.before, e.entityType);
  return name ? `${kind} “${name}” (#${e.entityId})` : `${kind} #${e.entityId}`;
}

/** What the actor did, as a phrase after their name. */
export function describeAuditEvent(e: { action: string; entityType: string; entityId: number; before?: unknown; after?: unknown }): string {
  const what = describeAuditRecord(e);
  const phrase = ACTION_PHRASES[e.action];
  return phrase ? phrase(what) : `${e.action.replace(/_/g, ' ')} ${what}`;
}
