/**
 * Every TanStack Query key of the client, one key object per resource. Keys are hierarchical
 * (`all` ⊃ `lists()` ⊃ `list(filters)`; `details()` ⊃ `detail(id)` ⊃ what belongs to that
 * record), so an invalidation names exactly what a change affects: `surveyKeys.detail(7)`
 * refreshes survey 7 with its readings, map and verdicts; add `exact: true` for the record
 * alone. Queries and invalidations use these and never spell a key by hand.
 */

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
  token: (token: string) => [...authKeys.all, 'tokens', token] as const,
};

export const userKeys = {
  all: ['users'] as const,
  list: () => [...userKeys.all, 'list'] as const,
};

export const organizationKeys = {
  all: ['organization'] as const,
  current: () => [...organizationKeys.all, 'current'] as const,
};

export const outboxKeys = {
  all: ['outbox'] as const,
  list: (filters: { status?: string } = {}) => [...outboxKeys.all, 'list', filters] as const,
};

/** PDF reports being built on the server (polled until done). */
export const reportJobKeys = {
  all: ['report-jobs'] as const,
  detail: (id: string) => [...reportJobKeys.all, id] as const,
};

export const auditKeys = {
  all: ['audit'] as const,
  list: (filters: { probeId?: number; surveyId?: number; entityType?: string }) => [...auditKeys.all, 'list', filters] as const,
};

export const siteKeys = {
  all: ['sites'] as const,
  list: () => [...siteKeys.all, 'list'] as const,
  /** Sites with their latest survey's verdict counts. */
  overview: () => [...siteKeys.all, 'overview'] as const,
  /** Zones due for maintenance across the sites, with their signed-off trend. */
  maintenance: () => [...siteKeys.all, 'maintenance'] as const,
};

export const surveyKeys = {
  all: ['surveys'] as const,
  lists: () => [...surveyKeys.all, 'list'] as const,
  list: (filters: { siteId?: number }) => [...surveyKeys.lists(), filters] as const,
  details: () => [...surveyKeys.all, 'detail'] as const,
  /** The survey record (with its abilities); everything below belongs to the survey. */
  detail: (surveyId: number) => [...surveyKeys.details(), surveyId] as const,
  readings: (surveyId: number) => [...surveyKeys.detail(surveyId), 'readings'] as const,
  readingsPage: (surveyId: number, filters: object, page: number) => [...surveyKeys.readings(surveyId), 'page', filters, page] as const,
  series: (surveyId: number) => [...surveyKeys.readings(surveyId), 'series'] as const,
  maps: (surveyId: number) => [...surveyKeys.detail(surveyId), 'map'] as const,
  map: (surveyId: number, planId: number | null) => [...surveyKeys.maps(surveyId), { planId }] as const,
  compliance: (surveyId: number) => [...surveyKeys.detail(surveyId), 'compliance'] as const,
  /** What the latest re-decode changed (refreshed with the survey after a re-decode). */
  decodeChanges: (surveyId: number) => [...surveyKeys.detail(surveyId), 'decode-changes'] as const,
  zoneCompliance: (surveyId: number, zoneId: number) => [...surveyKeys.compliance(surveyId), 'zones', zoneId] as const,
  /** Planned grids and points (with their reading counts), for the whole survey or one plan. */
  plannedPoints: (surveyId: number, planId: number | null) => [...surveyKeys.detail(surveyId), 'planned-points', { planId }] as const,
  unplaced: (surveyId: number) => [...surveyKeys.detail(surveyId), 'unplaced'] as const,
  /** What the field view keeps of the survey (plans, points, records, photos). */
  field: (surveyId: number) => [...surveyKeys.detail(surveyId), 'field'] as const,
};

export const importKeys = {
  all: ['imports'] as const,
  detail: (importId: number) => [...importKeys.all, 'detail', importId] as const,
};

export const planKeys = {
  all: ['plans'] as const,
  lists: () => [...planKeys.all, 'list'] as const,
  list: (siteId: number) => [...planKeys.lists(), { siteId }] as const,
  details: () => [...planKeys.all, 'detail'] as const,
  detail: (planId: number) => [...planKeys.details(), planId] as const,
  zones: (planId: number) => [...planKeys.detail(planId), 'zones'] as const,
};

export const targetKeys = {
  all: ['targets'] as const,
  list: () => [...targetKeys.all, 'list'] as const,
  zones: () => [...targetKeys.all, 'zone'] as const,
  zone: (zoneId: number) => [...targetKeys.zones(), zoneId] as const,
};

export const probeKeys = {
  all: ['probes'] as const,
  list: () => [...probeKeys.all, 'list'] as const,
  /** Every probe with its due date and calibration state. */
  dashboard: () => [...probeKeys.all, 'dashboard'] as const,
  details: () => [...probeKeys.all, 'detail'] as const,
  detail: (probeId: number) => [...probeKeys.details(), probeId] as const,
  coefficientSets: (probeId: number) => [...probeKeys.detail(probeId), 'coefficient-sets'] as const,
  benchRuns: (probeId: number) => [...probeKeys.detail(probeId), 'bench-runs'] as const,
  surveys: (probeId: number) => [...probeKeys.detail(probeId), 'surveys'] as const,
};

export const benchRunKeys = {
  all: ['bench-runs'] as const,
  detail: (benchRunId: number) => [...benchRunKeys.all, 'detail', benchRunId] as const,
};

export const emergencyKeys = {
  all: ['emergency'] as const,
  criteriaSets: () => [...emergencyKeys.all, 'criteria-sets'] as const,
  /** A plan's escape routes, areas and equipment points. */
  elements: (planId: number) => [...emergencyKeys.all, 'elements', { planId }] as const,
  surveys: () => [...emergencyKeys.all, 'surveys'] as const,
  surveyList: (filters: { siteId?: number }) => [...emergencyKeys.surveys(), 'list', filters] as const,
  /** An emergency survey with its verdicts: part of the survey, so a new log's invalidation of surveyKeys.detail refreshes it. */
  survey: (surveyId: number) => [...surveyKeys.detail(surveyId), 'emergency'] as const,
  tests: () => [...emergencyKeys.all, 'tests'] as const,
  logbook: (siteId: number) => [...emergencyKeys.tests(), 'site', siteId] as const,
  testsDue: () => [...emergencyKeys.tests(), 'due'] as const,
  /** The organisation's test intervals (every due date follows them). */
  schedule: () => [...emergencyKeys.tests(), 'schedule'] as const,
};
