import { createBrowserRouter, redirect, type LoaderFunctionArgs, type RouteObject } from 'react-router';
import { queryClient } from '@/lib/query-client';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { AppShell } from './layout/app-shell';
import { Gate } from './gate';
import { RouteErrorBoundary } from './routes/route-error';
import { NotFoundRoute } from './routes/not-found';
import { SignInRoute } from './routes/auth/sign-in';
import { ForgotPasswordRoute } from './routes/auth/forgot-password';
import { TokenPasswordRoute } from './routes/auth/token-password';
import { HomeRoute } from './routes/home';
import { UsersRoute } from './routes/admin/users';
import { OutboxRoute } from './routes/admin/outbox';
import { PlansIndexRoute } from './routes/plans/plans-index';
import { PlanDetailRoute } from './routes/plans/plan-detail';
import { SurveyMapRoute } from './routes/plans/survey-map';
import { CalibrationDashboardRoute } from './routes/calibration/calibration-dashboard';
import { ProbesIndexRoute } from './routes/calibration/probes-index';
import { ProbeNewRoute } from './routes/calibration/probe-new';
import { ProbeDetailRoute } from './routes/calibration/probe-detail';
import { ProbeEditRoute } from './routes/calibration/probe-edit';
import { BenchRunRoute } from './routes/calibration/bench-run';
import { CalibrationAuditRoute } from './routes/calibration/calibration-audit';
import { SurveysIndexRoute } from './routes/surveys/surveys-index';
import { SurveyDetailRoute } from './routes/surveys/survey-detail';
import { ComplianceOverviewRoute } from './routes/compliance/compliance-overview';
import { SurveyComplianceRoute } from './routes/compliance/survey-compliance';
import { ZoneComplianceRoute } from './routes/compliance/zone-compliance';
import { TargetsRoute } from './routes/compliance/targets';
import { SettingsRoute } from './routes/compliance/settings';

/** The signed-in shell's loader: no user, no shell (back to sign-in, then here again). */
async function requireUser({ request }: LoaderFunctionArgs) {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) {
    const url = new URL(request.url);
    throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return null;
}

async function redirectIfSignedIn() {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  return user ? redirect('/') : null;
}

/**
 * Signed-in pages. Features add their routes here; pages that compose several features live
 * in src/app/routes/. Wrap a page in <Gate capability=…> when only some roles may use it.
 */
const appRoutes: RouteObject[] = [
  { index: true, element: <HomeRoute /> },
  { path: 'users', element: <Gate capability="users.manage"><UsersRoute /></Gate> },
  { path: 'outbox', element: <Gate capability="outbox.read"><OutboxRoute /></Gate> },
  { path: 'plans', element: <Gate capability="sites.read"><PlansIndexRoute /></Gate> },
  { path: 'plans/:planId', element: <Gate capability="sites.read"><PlanDetailRoute /></Gate> },
  { path: 'surveys', element: <Gate capability="surveys.read"><SurveysIndexRoute /></Gate> },
  { path: 'surveys/:surveyId', element: <Gate capability="surveys.read"><SurveyDetailRoute /></Gate> },
  { path: 'surveys/:surveyId/map', element: <Gate capability="surveys.read"><SurveyMapRoute /></Gate> },
  { path: 'calibration', element: <Gate capability="probes.read"><CalibrationDashboardRoute /></Gate> },
  { path: 'calibration/probes', element: <Gate capability="probes.read"><ProbesIndexRoute /></Gate> },
  { path: 'calibration/probes/new', element: <Gate capability="probes.write"><ProbeNewRoute /></Gate> },
  { path: 'calibration/probes/:probeId', element: <Gate capability="probes.read"><ProbeDetailRoute /></Gate> },
  { path: 'calibration/probes/:probeId/edit', element: <Gate capability="probes.write"><ProbeEditRoute /></Gate> },
  { path: 'calibration/bench-runs/:benchRunId', element: <Gate capability="coefficients.read"><BenchRunRoute /></Gate> },
  { path: 'calibration/audit', element: <Gate capability="audit.read"><CalibrationAuditRoute /></Gate> },
  { path: 'compliance', element: <Gate capability="surveys.read"><ComplianceOverviewRoute /></Gate> },
  { path: 'compliance/surveys/:surveyId', element: <Gate capability="surveys.read"><SurveyComplianceRoute /></Gate> },
  { path: 'compliance/surveys/:surveyId/zones/:zoneId', element: <Gate capability="surveys.read"><ZoneComplianceRoute /></Gate> },
  { path: 'targets', element: <Gate capability="targets.read"><TargetsRoute /></Gate> },
  { path: 'settings', element: <Gate capability="organization.settings"><SettingsRoute /></Gate> },
];

export const routes: RouteObject[] = [
  { path: '/sign-in', element: <SignInRoute />, loader: redirectIfSignedIn, errorElement: <RouteErrorBoundary /> },
  { path: '/forgot-password', element: <ForgotPasswordRoute />, errorElement: <RouteErrorBoundary /> },
  { path: '/reset-password', element: <TokenPasswordRoute purpose="reset" />, errorElement: <RouteErrorBoundary /> },
  { path: '/accept-invite', element: <TokenPasswordRoute purpose="invite" />, errorElement: <RouteErrorBoundary /> },
  {
    path: '/',
    element: <AppShell />,
    loader: requireUser,
    errorElement: <RouteErrorBoundary />,
    children: [...appRoutes, { path: '*', element: <NotFoundRoute /> }],
  },
];

export const createRouter = () => createBrowserRouter(routes);
