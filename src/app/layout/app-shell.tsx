import { useState } from 'react';
import { NavLink, Outlet, useNavigate, useNavigation } from 'react-router';
import { LogOut, Menu, X } from 'lucide-react';
import { can } from '@shared/policy';
import { ROLE_LABELS } from '@shared/roles';
import { NAV_ITEMS } from '../nav';
import { useCurrentUser } from '../current-user';
import { useSignOut } from '@/features/auth/api/sign-out';
import { LuxtrailMark } from '@/components/brand/luxtrail-mark';
import { UnitsToggle } from '@/components/ui/units-toggle';
import { cx } from '@/components/ui/cx';
import { paths } from '@shared/paths';

export function AppShell() {
  const user = useCurrentUser();
  const [open, setOpen] = useState(false);
  const navigate = useNavigate();
  const navigation = useNavigation();
  const signOut = useSignOut();
  const items = NAV_ITEMS.filter((i) => !i.capability || can(user.role, i.capability));

  const nav = (
    <nav aria-label="Main" className="flex flex-col gap-6">
      {(['work', 'admin'] as const).map((group) => {
        const groupItems = items.filter((i) => i.group === group);
        if (!groupItems.length) return null;
        return (
          <div key={group}>
            <div className="mb-2 px-3 text-[11px] font-semibold uppercase tracking-wider text-ink-300">{group === 'work' ? 'Work' : 'Administration'}</div>
            <ul className="flex flex-col gap-0.5">
              {groupItems.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.to === paths.home.to()}
                    onClick={() => setOpen(false)}
                    className={({ isActive }) => cx('flex items-center gap-3 rounded-lg px-3 py-2 text-sm font-medium transition-colors', isActive ? 'bg-ink-800 text-white' : 'text-ink-300 hover:bg-ink-800/60 hover:text-white')}
                  >
                    <item.icon className="h-4 w-4" aria-hidden />
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </div>
        );
      })}
    </nav>
  );

  const account = (
    <div className="border-t border-ink-800 pt-4">
      <div className="px-3 text-sm font-medium text-white">{user.name}</div>
      <div className="px-3 text-xs text-ink-300">{ROLE_LABELS[user.role]} · {user.organizationName}</div>
      <button
        type="button"
        onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(paths.signIn.to()) })}
        className="mt-3 flex w-full items-center gap-2 rounded-lg px-3 py-2 text-sm text-ink-300 hover:bg-ink-800 hover:text-white"
      >
        <LogOut className="h-4 w-4" aria-hidden /> Sign out
      </button>
    </div>
  );

  return (
    <div className="min-h-screen lg:grid lg:grid-cols-[15rem_1fr] lg:bg-[linear-gradient(to_right,#141b2d_15rem,transparent_15rem)]">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">Skip to content</a>
      <aside className="hidden bg-ink-900 lg:sticky lg:top-0 lg:flex lg:h-screen lg:flex-col lg:justify-between lg:p-4">
        <div className="flex flex-col gap-8">
          <LuxtrailMark className="h-8 px-2 text-white" />
          {nav}
        </div>
        <div className="flex flex-col gap-4">
          <UnitsToggle className="mx-3 self-start" />
          {account}
        </div>
      </aside>
      <header className="sticky top-0 z-30 flex items-center justify-between bg-ink-900 px-4 py-3 lg:hidden">
        <LuxtrailMark className="h-7 text-white" />
        <div className="flex items-center gap-2">
          <UnitsToggle />
          <button type="button" aria-label={open ? 'Close menu' : 'Open menu'} aria-expanded={open} onClick={() => setOpen(!open)} className="rounded-lg p-2 text-white hover:bg-ink-800">
            {open ? <X className="h-5 w-5" /> : <Menu className="h-5 w-5" />}
          </button>
        </div>
      </header>
      {open && (
        <div className="fixed inset-x-0 top-[3.25rem] z-20 flex flex-col gap-6 bg-ink-900 p-4 pb-6 shadow-xl lg:hidden">
          {nav}
          {account}
        </div>
      )}
      <main id="main" className="min-w-0">
        {navigation.state === 'loading' && <div className="fixed inset-x-0 top-0 z-50 h-0.5 animate-pulse bg-lamp-400" aria-hidden />}
        <Outlet />
      </main>
    </div>
  );
}
