import { Link } from 'react-router';
import { ArrowRight, TriangleAlert } from 'lucide-react';
import { can } from '@shared/policy';
import { ROLE_LABELS } from '@shared/roles';
import { paths } from '@shared/paths';
import { NAV_ITEMS } from '../nav';
import { useCurrentUser } from '../current-user';
import { Page, PageHeader } from '@/components/ui/page';

export function HomeRoute() {
  const user = useCurrentUser();
  const items = NAV_ITEMS.filter((i) => i.to !== paths.home.to() && (!i.capability || can(user.role, i.capability)));
  return (
    <Page>
      <PageHeader eyebrow={`${ROLE_LABELS[user.role]} · ${user.organizationName}`} title={`Hello, ${user.name.split(' ')[0]}`} description="Pick up where your team left off." />
      <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
        {items.map((item) => (
          <li key={item.to}>
            <Link to={item.to} className="group flex h-full items-start gap-4 rounded-xl bg-white p-5 shadow-card ring-1 ring-ink-100 transition hover:ring-lamp-300">
              <span className="rounded-lg bg-lamp-50 p-2.5 text-lamp-700"><item.icon className="h-5 w-5" aria-hidden /></span>
              <span className="min-w-0 flex-1">
                <span className="flex items-center justify-between font-semibold text-ink-900">{item.label}<ArrowRight className="h-4 w-4 text-ink-300 transition group-hover:translate-x-0.5 group-hover:text-lamp-600" aria-hidden /></span>
                <span className="mt-1 block text-sm text-ink-600">{item.description ?? ''}</span>
              </span>
            </Link>
          </li>
        ))}
      </ul>
      <aside className="mt-8 flex gap-3 rounded-xl bg-lamp-50 p-4 text-sm text-lamp-900 ring-1 ring-lamp-200">
        <TriangleAlert className="h-5 w-5 shrink-0 text-lamp-600" aria-hidden />
        <p>Luxtrail supports illuminance surveys. It does not certify emergency lighting, and it does not replace the judgement of a qualified lighting professional: local codes and regulations take precedence over the generic targets it ships, especially on stairs, exits, emergency routes and around machinery.</p>
      </aside>
    </Page>
  );
}
