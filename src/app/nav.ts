import type { LucideIcon } from 'lucide-react';
import {
  ClipboardCheck, ClipboardList as SurveysIcon, Gauge as CalibrationIcon, History as AuditIcon,
  LayoutDashboard, Library, Mail, Map as PlanIcon, Settings, Users,
} from 'lucide-react';
import type { Capability } from '@shared/policy';

export type NavItem = { to: string; label: string; icon: LucideIcon; capability?: Capability; group: 'work' | 'admin'; description?: string };

/** The app's navigation; each role sees the entries its capabilities allow (shared/policy.ts). */
export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Overview', icon: LayoutDashboard, group: 'work' },
  // Feature entries go here, in the order people use them.
  { to: '/surveys', label: 'Surveys', icon: SurveysIcon, capability: 'surveys.read', group: 'work', description: 'Sites, walk-through surveys, meter logs and their readings.' },
  { to: '/plans', label: 'Plans', icon: PlanIcon, capability: 'sites.read', group: 'work', description: 'Plans to scale, zones, and survey points on the plan.' },
  { to: '/compliance', label: 'Verdicts', icon: ClipboardCheck, capability: 'surveys.read', group: 'work', description: 'Which rooms meet their lighting targets, sign-off and reports.' },
  { to: '/targets', label: 'Targets', icon: Library, capability: 'targets.read', group: 'work', description: 'The target library: Em and U0 per use type, with sources.' },
  { to: '/calibration', label: 'Calibration', icon: CalibrationIcon, capability: 'probes.read', group: 'work', description: 'Probes, coefficient sets, bench runs and due dates.' },
  { to: '/calibration/audit', label: 'Audit trail', icon: AuditIcon, capability: 'audit.read', group: 'work', description: 'Who changed which probe or coefficient set, and how.' },
  { to: '/users', label: 'Users', icon: Users, capability: 'users.manage', group: 'admin', description: 'Invite colleagues and set their roles.' },
  { to: '/outbox', label: 'Outbox', icon: Mail, capability: 'outbox.read', group: 'admin', description: 'Mail Luxtrail sent while no mail server is configured.' },
  { to: '/settings', label: 'Settings', icon: Settings, capability: 'organization.settings', group: 'admin', description: 'The decision rule verdicts are printed with.' },
];
