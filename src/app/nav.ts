import type { LucideIcon } from 'lucide-react';
import {
  ClipboardCheck, ClipboardList as SurveysIcon, Gauge as CalibrationIcon, History as AuditIcon,
  LayoutDashboard, Library, Mail, Map as PlanIcon, Settings, Siren, Smartphone as FieldIcon, Users, Wrench,
} from 'lucide-react';
import type { Capability } from '@shared/policy';
import { paths } from '@shared/paths';

export type NavItem = { to: string; label: string; icon: LucideIcon; capability?: Capability; group: 'work' | 'admin'; description?: string };

/** A navigation entry for a page of shared/paths.ts: its link and capability come from there. */
function entry(page: { pattern: string; capability: Capability | null; to: () => string }, item: Omit<NavItem, 'to' | 'capability'>): NavItem {
  return { ...item, to: page.to(), ...(page.capability ? { capability: page.capability } : {}) };
}

/** The app's navigation; each role sees the entries its capabilities allow (shared/policy.ts). */
export const NAV_ITEMS: NavItem[] = [
  entry(paths.home, { label: 'Overview', icon: LayoutDashboard, group: 'work' }),
  // Feature entries go here, in the order people use them.
  entry(paths.surveys, { label: 'Surveys', icon: SurveysIcon, group: 'work', description: 'Sites, walk-through surveys, meter logs and their readings.' }),
  entry(paths.field, { label: 'Field view', icon: FieldIcon, group: 'work', description: 'Measure on a phone, with or without a logging meter or a connection.' }),
  entry(paths.plans, { label: 'Plans', icon: PlanIcon, group: 'work', description: 'Plans to scale, zones, and survey points on the plan.' }),
  entry(paths.compliance, { label: 'Verdicts', icon: ClipboardCheck, group: 'work', description: 'Which rooms meet their lighting targets, sign-off and reports.' }),
  entry(paths.emergency, { label: 'Emergency lighting', icon: Siren, group: 'work', description: 'Escape routes and areas surveyed in the dark, verdicts, and the test logbook with due dates.' }),
  entry(paths.maintenance, { label: 'Maintenance', icon: Wrench, group: 'work', description: 'Zones whose signed-off levels fell below their maintained value, or are heading there.' }),
  entry(paths.targets, { label: 'Targets', icon: Library, group: 'work', description: 'The target library: Em and U0 per use type, with sources.' }),
  entry(paths.calibration, { label: 'Calibration', icon: CalibrationIcon, group: 'work', description: 'Probes, coefficient sets, bench runs and due dates.' }),
  entry(paths.audit, { label: 'Audit trail', icon: AuditIcon, group: 'work', description: 'Who changed which probe or coefficient set, and how.' }),
  entry(paths.users, { label: 'Users', icon: Users, group: 'admin', description: 'Invite colleagues and set their roles.' }),
  entry(paths.outbox, { label: 'Outbox', icon: Mail, group: 'admin', description: 'Mail Luxtrail sent while no mail server is configured.' }),
  entry(paths.settings, { label: 'Settings', icon: Settings, group: 'admin', description: 'The decision rule verdicts are printed with.' }),
];
