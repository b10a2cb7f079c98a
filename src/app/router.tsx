import type { ComponentType } from 'react';
import { createBrowserRouter, redirect, type LoaderFunctionArgs, type RouteObject } from 'react-router';
import { paths, type PageName } from '@shared/paths';
import { queryClient } from '@/lib/query-client';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { AppShell } from './layout/app-shell';
import { Gate } from './gate';
import { RouteErrorBoundary } from './routes/route-error';
import { NotFoundRoute } from './routes/not-found';

/** The signed-in shell's loader: no user, no shell (back to sign-in, then here again). */
async function requireUser({ request }: LoaderFunctionArgs) {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) {
    const url = new URL(request.url);
    throw redirect(paths.signIn.to(url.pathname + url.search));
  }
  return null;
}

async function redirectIfSignedIn() {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  return user ? redirect(paths.home.to()) : null;
}

/**
 * A page loaded on demand (its own chunk, with the widgets only it uses), at the path and
 * behind the capability that shared/paths.ts gives it.
 */
function lazyPage(name: PageName, load: () => Promise<ComponentType>, extra: Omit<RouteObject, 'path' | 'lazy' | 'index' | 'children'> = {}): RouteObject {
  const { pattern, capability } = paths[name];
  return {
    ...extra,
    ...(pattern === '/' ? { index: true } : { path: pattern }),
    lazy: async () => {
      const Page = await load();
      return { Component: capability ? () => <Gate capability={capability}><Page /></Gate> : Page };
    },
  };
}

/**
 * Signed-in pages, one lazy chunk each. Add a page to shared/paths.ts, then here; pages that
 * compose several features live in src/app/routes/.
 */
const appRoutes: RouteObject[] = [
  lazyPage('home', () => import('./routes/home').then((m) => m.HomeRoute)),
  lazyPage('users', () => import('./routes/admin/users').then((m) => m.UsersRoute)),
  lazyPage('outbox', () => import('./routes/admin/outbox').then((m) => m.OutboxRoute)),
  lazyPage('plans', () => import('./routes/plans/plans-index').then((m) => m.PlansIndexRoute)),
  lazyPage('plan', () => import('./routes/plans/plan-detail').then((m) => m.PlanDetailRoute)),
  lazyPage('surveys', () => import('./routes/surveys/surveys-index').then((m) => m.SurveysIndexRoute)),
  lazyPage('survey', () => import('./routes/surveys/survey-detail').then((m) => m.SurveyDetailRoute)),
  lazyPage('surveyMap', () => import('./routes/plans/survey-map').then((m) => m.SurveyMapRoute)),
  lazyPage('calibration', () => import('./routes/calibration/calibration-dashboard').then((m) => m.CalibrationDashboardRoute)),
  lazyPage('probes', () => import('./routes/calibration/probes-index').then((m) => m.ProbesIndexRoute)),
  lazyPage('probeNew', () => import('./routes/calibration/probe-new').then((m) => m.ProbeNewRoute)),
  lazyPage('probe', () => import('./routes/calibration/probe-detail').then((m) => m.ProbeDetailRoute)),
  lazyPage('probeEdit', () => import('./routes/calibration/probe-edit').then((m) => m.ProbeEditRoute)),
  lazyPage('benchRun', () => import('./routes/calibration/bench-run').then((m) => m.BenchRunRoute)),
  lazyPage('audit', () => import('./routes/calibration/calibration-audit').then((m) => m.CalibrationAuditRoute)),
  lazyPage('decodeChanges', () => import('./routes/calibration/decode-changes').then((m) => m.DecodeChangesRoute)),
  lazyPage('compliance', () => import('./routes/compliance/compliance-overview').then((m) => m.ComplianceOverviewRoute)),
  lazyPage('maintenance', () => import('./routes/compliance/maintenance').then((m) => m.MaintenanceRoute)),
  lazyPage('surveyCompliance', () => import('./routes/compliance/survey-compliance').then((m) => m.SurveyComplianceRoute)),
  lazyPage('zoneCompliance', () => import('./routes/compliance/zone-compliance').then((m) => m.ZoneComplianceRoute)),
  lazyPage('targets', () => import('./routes/compliance/targets').then((m) => m.TargetsRoute)),
  lazyPage('settings', () => import('./routes/compliance/settings').then((m) => m.SettingsRoute)),
  lazyPage('emergency', () => import('./routes/emergency/emergency-overview').then((m) => m.EmergencyOverviewRoute)),
  lazyPage('emergencyPlan', () => import('./routes/emergency/emergency-plan').then((m) => m.EmergencyPlanRoute)),
  lazyPage('emergencySurvey', () => import('./routes/emergency/emergency-survey').then((m) => m.EmergencySurveyRoute)),
  lazyPage('emergencyCriteria', () => import('./routes/emergency/criteria').then((m) => m.EmergencyCriteriaRoute)),
  lazyPage('emergencyLogbook', () => import('./routes/emergency/logbook').then((m) => m.LogbookRoute)),
];

const publicPage = { errorElement: <RouteErrorBoundary /> };

export const routes: RouteObject[] = [
  lazyPage('signIn', () => import('./routes/auth/sign-in').then((m) => m.SignInRoute), { ...publicPage, loader: redirectIfSignedIn }),
  lazyPage('forgotPassword', () => import('./routes/auth/forgot-password').then((m) => m.ForgotPasswordRoute), publicPage),
  lazyPage('resetPassword', () => import('./routes/auth/token-password').then((m) => () => <m.TokenPasswordRoute purpose="reset" />), publicPage),
  lazyPage('acceptInvite', () => import('./routes/auth/token-password').then((m) => () => <m.TokenPasswordRoute purpose="invite" />), publicPage),
  {
    // The field view has its own phone-first frame (usable offline) and loads its code only when opened.
    path: paths.field.pattern,
    lazy: async () => {
      const m = await import('./routes/field/field-shell');
      return { Component: m.FieldShell, loader: m.fieldShellLoader };
    },
    errorElement: <RouteErrorBoundary />,
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./routes/field/field-index')).FieldIndexRoute }) },
      { path: paths.fieldSurvey.pattern.slice(paths.field.pattern.length + 1), lazy: async () => ({ Component: (await import('./routes/field/field-survey')).FieldSurveyRoute }) },
    ],
  },
  {
    path: paths.home.pattern,
    element: <AppShell />,
    loader: requireUser,
    errorElement: <RouteErrorBoundary />,
    children: [...appRoutes, { path: '*', element: <NotFoundRoute /> }],
  },
];

export const createRouter = () => createBrowserRouter(routes);
