import type { Api } from './http/api';
import type { Deps } from './deps';
import type { SeedContext } from './db/seed-context';
import type { ComputeTask } from './compute/compute-pool';
import { verdictAggregateTask } from './modules/compliance/verdict-aggregates';
import { allPartsTask, mapReadingsTask, zonePointsTask } from './modules/compliance/answer-parts';
import { WARM_VERDICTS_JOB, warmVerdicts } from './modules/compliance/warm-verdicts';
import { reportPdfTask } from './modules/reports/report-job';
import { readingSeriesTask, readingsPageTask } from './modules/readings/readings-service';
import { pageMarksTask } from './modules/readings/reading-page-marks';
import { registerHealthRoutes } from './modules/health/health-routes';
import { registerAuthRoutes } from './modules/auth/auth-routes';
import { registerUserRoutes } from './modules/users/users-routes';
import { registerOutboxRoutes } from './modules/outbox/outbox-routes';
import { registerAuditRoutes } from './modules/audit/audit-routes';
import { registerProbeRoutes } from './modules/probes/probes-routes';
import { registerCoefficientSetRoutes } from './modules/coefficient-sets/coefficient-sets-routes';
import { registerBenchRunRoutes } from './modules/bench-runs/bench-runs-routes';
import { registerCalibrationRoutes } from './modules/calibration/calibration-routes';
import { runCalibrationReminders } from './modules/calibration/reminders-service';
import { registerSiteRoutes } from './modules/sites/sites-routes';
import { registerSurveyRoutes } from './modules/surveys/surveys-routes';
import { surveyReadingFactsTask } from './modules/surveys/surveys-service';
import { registerPlanRoutes } from './modules/plans/plans-routes';
import { registerZoneRoutes } from './modules/zones/zones-routes';
import { registerImportRoutes } from './modules/imports/imports-routes';
import { registerReadingRoutes } from './modules/readings/readings-routes';
import { registerPlannedPointRoutes } from './modules/planned-points/planned-points-routes';
import { labelCountsTask } from './modules/planned-points/planned-points-service';
import { registerPlacementRoutes } from './modules/placements/placements-routes';
import { unplacedTask } from './modules/placements/placements-service';
import { registerTargetRoutes } from './modules/targets/targets-routes';
import { registerOrganizationRoutes } from './modules/organization/organization-routes';
import { registerComplianceRoutes } from './modules/compliance/compliance-routes';
import { registerWorkflowRoutes } from './modules/workflow/workflow-routes';
import { registerReportRoutes } from './modules/reports/reports-routes';
import { registerFieldRoutes } from './modules/field/field-routes';
import { registerEmergencyRoutes } from './modules/emergency/emergency-routes';
import { runEmergencyTestReminders } from './modules/emergency/test-reminders-service';
import { seedCalibration } from './db/seed-calibration';
import { seedSurveyLogs, seedSurveys } from './db/seed-surveys';
import { seedPlans } from './db/seed-plans';
import { seedCompliance } from './db/seed-compliance';
import { seedEmergency } from './db/seed-emergency';
import { seedCommissioning } from './db/seed-commissioning';
import { seedLabelWalk } from './db/seed-grids';

/** Background work a real server runs every `everyMs` (server/jobs.ts). */
export type Job = { name: string; everyMs: number; run: (deps: Deps) => Promise<unknown> | unknown };
/** A feature's demo data, run once on an empty database after the organisations and users (server/db/seed.ts). */
export type SeedStep = (deps: Deps, ctx: SeedContext) => Promise<void> | void;

export type ServerModule = {
  name: string;
  /** Declares the module's routes on the one route table. */
  routes?: (api: Api, deps: Deps) => void;
  jobs?: Job[];
  seed?: SeedStep;
  /** Heavy work the compute pool's threads may run for this module (server/compute/compute-pool.ts). */
  computeTasks?: ComputeTask[];
  /** Handlers of the durable job queue's jobs this module sends (server/lib/job-queue.ts), registered by app.ts. */
  queueWork?: { name: string; run: (deps: Deps, data: unknown) => Promise<void> | void }[];
};

const DAY_MS = 24 * 3600_000;

/**
 * Every server module, read by app.ts (routes), jobs.ts (jobs) and seed.ts (demo data). Nothing
 * registers itself by being imported: a new module is added here. Seed steps run in this order,
 * so a module comes after those whose demo data it builds on.
 */
export const SERVER_MODULES: ServerModule[] = [
  { name: 'health', routes: registerHealthRoutes },
  { name: 'auth', routes: registerAuthRoutes },
  { name: 'users', routes: registerUserRoutes },
  { name: 'outbox', routes: registerOutboxRoutes },
  { name: 'audit', routes: registerAuditRoutes },
  // Probes and coefficient sets first: every survey log is decoded with them.
  { name: 'probes', routes: registerProbeRoutes, seed: seedCalibration },
  { name: 'coefficient-sets', routes: registerCoefficientSetRoutes },
  { name: 'bench-runs', routes: registerBenchRunRoutes },
  { name: 'calibration', routes: registerCalibrationRoutes, jobs: [{ name: 'calibration-reminders', everyMs: DAY_MS, run: (deps) => runCalibrationReminders(deps) }] },
  { name: 'sites', routes: registerSiteRoutes },
  // The demo site and its surveys, then the site's plans and zones, then the logs (rows name their plan).
  { name: 'surveys', routes: registerSurveyRoutes, seed: seedSurveys, computeTasks: [surveyReadingFactsTask] },
  { name: 'plans', routes: registerPlanRoutes, seed: seedPlans },
  { name: 'zones', routes: registerZoneRoutes },
  { name: 'imports', routes: registerImportRoutes, seed: seedSurveyLogs },
  { name: 'readings', routes: registerReadingRoutes, computeTasks: [readingsPageTask, pageMarksTask, readingSeriesTask] },
  // A survey planned with measurement grids whose log names the planned points by label only.
  { name: 'planned-points', routes: registerPlannedPointRoutes, seed: seedLabelWalk, computeTasks: [labelCountsTask] },
  { name: 'placements', routes: registerPlacementRoutes, computeTasks: [unplacedTask] },
  { name: 'targets', routes: registerTargetRoutes },
  { name: 'organization', routes: registerOrganizationRoutes },
  // The target library and the sign-off of the earlier walk-through.
  { name: 'compliance', routes: registerComplianceRoutes, seed: seedCompliance, computeTasks: [verdictAggregateTask, zonePointsTask, mapReadingsTask, allPartsTask], queueWork: [{ name: WARM_VERDICTS_JOB, run: warmVerdicts }] },
  { name: 'workflow', routes: registerWorkflowRoutes },
  { name: 'reports', routes: registerReportRoutes, computeTasks: [reportPdfTask] },
  // The field view: records synced from the phone (typed readings join the survey's readings).
  { name: 'field', routes: registerFieldRoutes },
  // The library's emergency lighting on the ground-floor plan, its night test and logbook.
  { name: 'emergency', routes: registerEmergencyRoutes, seed: seedEmergency, jobs: [{ name: 'emergency-test-reminders', everyMs: DAY_MS, run: (deps) => runEmergencyTestReminders(deps) }] },
  // Seeded after the rest so the earlier demo ids stay as they were (tests and README name them).
  // A refitted office measured new against Em / MF (EN 12464-1:2021 targets, cylindrical point, task-area bands).
  { name: 'commissioning-demo', seed: seedCommissioning },
];
