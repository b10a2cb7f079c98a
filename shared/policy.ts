import type { Role } from './roles';

/**
 * The one place that decides who may do what. The server enforces it on every route
 * (server/http/authorize.ts); the client reads it only to hide what a role cannot use.
 * Organisation isolation is not decided here: every query is scoped to the caller's
 * organisation in its service, and a record of another organisation is a 404.
 */
export const CAPABILITIES = {
  'users.manage': ['admin'],
  'outbox.read': ['admin'],
  'organization.settings': ['admin'],
  'sites.read': ['admin', 'surveyor', 'calibration', 'facility_manager'],
  'sites.write': ['admin', 'surveyor'],
  'plans.write': ['admin', 'surveyor'],
  'surveys.read': ['admin', 'surveyor', 'facility_manager'],
  'surveys.write': ['admin', 'surveyor'],
  'surveys.upload': ['admin', 'surveyor'],
  'surveys.submit': ['admin', 'surveyor'],
  'surveys.review': ['admin', 'facility_manager'],
  'surveys.redecode': ['admin', 'calibration'],
  'reports.send': ['admin', 'surveyor', 'facility_manager'],
  'probes.read': ['admin', 'surveyor', 'calibration'],
  /** Without it, probes.read shows only the probes in service (the ones a surveyor may use). */
  'probes.read_all': ['admin', 'calibration'],
  'probes.write': ['admin', 'calibration'],
  'coefficients.read': ['admin', 'surveyor', 'calibration'],
  'coefficients.write': ['admin', 'calibration'],
  'coefficients.approve': ['admin', 'calibration'],
  'reminders.run': ['admin'],
  'audit.read': ['admin', 'calibration', 'facility_manager'],
  'targets.read': ['admin', 'surveyor', 'calibration', 'facility_manager'],
  'targets.write': ['admin'],
  'logbook.write': ['admin', 'surveyor', 'facility_manager'],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

export function can(role: Role | null | undefined, capability: Capability): boolean {
  if (!role) return false;
  return (CAPABILITIES[capability] as readonly Role[]).includes(role);
}

/** Human descriptions for the README's role-by-capability table and the users page. */
export const CAPABILITY_LABELS: Record<Capability, string> = {
  'users.manage': 'Invite and manage users',
  'outbox.read': 'Read the e-mail outbox',
  'organization.settings': 'Change organisation settings (decision rule)',
  'sites.read': 'See sites',
  'sites.write': 'Create and edit sites',
  'plans.write': 'Upload plans, set scale, draw zones',
  'surveys.read': 'See surveys, readings and verdicts',
  'surveys.write': 'Create and edit surveys',
  'surveys.upload': 'Upload survey logs',
  'surveys.submit': 'Submit a survey for review',
  'surveys.review': 'Sign off or return a survey',
  'surveys.redecode': 'Re-decode a survey with corrected coefficients',
  'reports.send': 'E-mail a survey report',
  'probes.read': 'See probes',
  'probes.read_all': 'See out-of-service and retired probes too',
  'probes.write': 'Create and edit probes, upload bench runs',
  'coefficients.read': 'See coefficient sets',
  'coefficients.write': 'Draft coefficient sets',
  'coefficients.approve': 'Approve a colleague\'s coefficient set',
  'reminders.run': 'Run calibration reminders on demand',
  'audit.read': 'Read the audit trail',
  'targets.read': 'See the target library',
  'targets.write': 'Add and edit target entries',
  'logbook.write': 'Record emergency lighting tests in a site\'s logbook',
};
