import type { Capability } from './policy';

/**
 * Every page of the client: its pattern for the router, the capability it needs (null: any
 * signed-in user, or public for the sign-in pages) and `to(...)`, which builds a link to it.
 * The router, the navigation, every link and the server's e-mailed URLs use these, so a page
 * moves in one place.
 */
type Id = number | string;

function query(values: Record<string, string | number | undefined | null>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(values)) if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  const text = search.toString();
  return text ? `?${text}` : '';
}

function page<const P extends string, A extends unknown[]>(pattern: P, capability: Capability | null, to: (...args: A) => string) {
  return { pattern, capability, to };
}

export const paths = {
  // Public pages (outside the signed-in shell).
  signIn: page('/sign-in', null, (next?: string) => `/sign-in${query({ next })}`),
  forgotPassword: page('/forgot-password', null, () => '/forgot-password'),
  resetPassword: page('/reset-password', null, (token?: string) => `/reset-password${query({ token })}`),
  acceptInvite: page('/accept-invite', null, (token?: string) => `/accept-invite${query({ token })}`),

  // Signed-in pages.
  home: page('/', null, () => '/'),
  users: page('/users', 'users.manage', () => '/users'),
  outbox: page('/outbox', 'outbox.read', () => '/outbox'),
  plans: page('/plans', 'sites.read', (siteId?: Id) => `/plans${query({ site: siteId })}`),
  plan: page('/plans/:planId', 'sites.read', (planId: Id) => `/plans/${planId}`),
  surveys: page('/surveys', 'surveys.read', () => '/surveys'),
  survey: page('/surveys/:surveyId', 'surveys.read', (surveyId: Id) => `/surveys/${surveyId}`),
  surveyMap: page('/surveys/:surveyId/map', 'surveys.read', (surveyId: Id, planId?: Id) => `/surveys/${surveyId}/map${query({ planId })}`),
  calibration: page('/calibration', 'probes.read', () => '/calibration'),
  probes: page('/calibration/probes', 'probes.read', () => '/calibration/probes'),
  probeNew: page('/calibration/probes/new', 'probes.write', () => '/calibration/probes/new'),
  probe: page('/calibration/probes/:probeId', 'probes.read', (probeId: Id) => `/calibration/probes/${probeId}`),
  probeEdit: page('/calibration/probes/:probeId/edit', 'probes.write', (probeId: Id) => `/calibration/probes/${probeId}/edit`),
  benchRun: page('/calibration/bench-runs/:benchRunId', 'coefficients.read', (benchRunId: Id) => `/calibration/bench-runs/${benchRunId}`),
  decodeChanges: page('/calibration/surveys/:surveyId/decode-changes', 'surveys.redecode', (surveyId: Id) => `/calibration/surveys/${surveyId}/decode-changes`),
  audit: page('/calibration/audit', 'audit.read', (probeId?: Id) => `/calibration/audit${query({ probe: probeId })}`),
  compliance: page('/compliance', 'surveys.read', () => '/compliance'),
  maintenance: page('/compliance/maintenance', 'surveys.read', () => '/compliance/maintenance'),
  surveyCompliance: page('/compliance/surveys/:surveyId', 'surveys.read', (surveyId: Id) => `/compliance/surveys/${surveyId}`),
  zoneCompliance: page('/compliance/surveys/:surveyId/zones/:zoneId', 'surveys.read', (surveyId: Id, zoneId: Id) => `/compliance/surveys/${surveyId}/zones/${zoneId}`),
  field: page('/field', 'surveys.upload', () => '/field'),
  fieldSurvey: page('/field/surveys/:surveyId', 'surveys.upload', (surveyId: Id) => `/field/surveys/${surveyId}`),
  targets: page('/targets', 'targets.read', () => '/targets'),
  settings: page('/settings', 'organization.settings', () => '/settings'),
  emergency: page('/emergency', 'surveys.read', () => '/emergency'),
  emergencyPlan: page('/emergency/plans/:planId', 'surveys.read', (planId: Id) => `/emergency/plans/${planId}`),
  emergencySurvey: page('/emergency/surveys/:surveyId', 'surveys.read', (surveyId: Id) => `/emergency/surveys/${surveyId}`),
  emergencyCriteria: page('/emergency/criteria', 'surveys.read', () => '/emergency/criteria'),
  emergencyLogbook: page('/emergency/logbook/:siteId', 'surveys.read', (siteId: Id) => `/emergency/logbook/${siteId}`),
} as const;

export type PageName = keyof typeof paths;

/** An absolute link for e-mails: the configured public URL plus a page's path. */
export function absoluteUrl(publicUrl: string, path: string): string {
  return `${publicUrl.replace(/\/+$/, '')}${path}`;
}

/**
 * Files the API serves for the browser to open or save (downloads, plan images): the one place
 * their addresses are spelled, used by the client's links and by the server's answers. JSON
 * endpoints are called through the client's `api` helper from one file per endpoint.
 */
export const apiFiles = {
  planImage: (planId: Id, sha256: string) => `/api/plans/${planId}/image${query({ v: sha256.slice(0, 16) })}`,
  surveyReadingsCsv: (surveyId: Id, unit: 'lux' | 'fc') => `/api/surveys/${surveyId}/readings.csv${query({ unit })}`,
  surveyReportPdf: (surveyId: Id, unit: 'lx' | 'fc') => `/api/surveys/${surveyId}/report.pdf${query({ unit })}`,
  surveyZonesCsv: (surveyId: Id) => `/api/surveys/${surveyId}/compliance/zones.csv`,
  surveyVerdictReadingsCsv: (surveyId: Id) => `/api/surveys/${surveyId}/compliance/readings.csv`,
  walkSheetPdf: (surveyId: Id) => `/api/surveys/${surveyId}/walk-sheet.pdf`,
  plannedPointsCsv: (surveyId: Id) => `/api/surveys/${surveyId}/planned-points.csv`,
  emergencyReportPdf: (surveyId: Id, unit: 'lx' | 'fc') => `/api/emergency/surveys/${surveyId}/report.pdf${query({ unit })}`,
  benchRunFile: (benchRunId: Id) => `/api/bench-runs/${benchRunId}/file`,
  certificate: (coefficientSetId: Id) => `/api/coefficient-sets/${coefficientSetId}/certificate`,
  outboxAttachment: (attachmentId: Id) => `/api/outbox/attachments/${attachmentId}`,
  reportJobFile: (jobId: Id) => `/api/report-jobs/${jobId}/file`,
  fieldPhoto: (photoId: Id) => `/api/field-photos/${photoId}`,
} as const;
