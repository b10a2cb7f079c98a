import type { LucideIcon } from 'lucide-react';
import { LayoutDashboard, Users, Mail } from 'lucide-react';
import type { Capability } from '@shared/policy';

export type NavItem = { to: string; label: string; icon: LucideIcon; capability?: Capability; group: 'work' | 'admin'; description?: string };

/** The app's navigation; each role sees the entries its capabilities allow (shared/policy.ts). */
export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Overview', icon: LayoutDashboard, group: 'work' },
  // Feature entries go here, in the order people use them.
  { to: '/users', label: 'Users', icon: Users, capability: 'users.manage', group: 'admin', description: 'Invite colleagues and set their roles.' },
  { to: '/outbox', label: 'Outbox', icon: Mail, capability: 'outbox.read', group: 'admin', description: 'Mail Luxtrail sent while no mail server is configured.' },
];
