import { Link, Outlet, redirect, useLoaderData, type LoaderFunctionArgs } from 'react-router';
import { ArrowLeft } from 'lucide-react';
import { queryClient } from '@/lib/query-client';
import { ApiRequestError } from '@/lib/api-client';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { LuxtrailMark } from '@/components/brand/luxtrail-mark';
import { UnitsToggle } from '@/components/ui/units-toggle';
import type { SessionUser } from '@shared/schemas/auth';
import { paths } from '@shared/paths';

const LAST_USER = 'luxtrail.field.user';

/**
 * The field pages' loader: a signed-in user as everywhere, but with the network off the user who
 * last opened the field view on this phone (the server checks every record again at sync).
 */
export async function fieldShellLoader({ request }: LoaderFunctionArgs): Promise<SessionUser> {
  try {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) {
      const url = new URL(request.url);
      throw redirect(paths.signIn.to(url.pathname + url.search));
    }
    localStorage.setItem(LAST_USER, JSON.stringify(user));
    return user;
  } catch (err) {
    const kept = localStorage.getItem(LAST_USER);
    if (err instanceof ApiRequestError && err.status === 0 && kept) return JSON.parse(kept) as SessionUser;
    throw err;
  }
}

/** A plain, high-contrast frame for the phone: the brand, the way back and the unit switch. */
export function FieldShell() {
  const user = useLoaderData() as SessionUser;
  return (
    <div className="min-h-screen bg-ink-50 text-ink-950">
      <header className="sticky top-0 z-30 flex items-center justify-between gap-2 bg-ink-950 px-3 py-2">
        <Link to={paths.field.to()} className="flex min-h-11 items-center gap-2 text-sm font-semibold text-white" aria-label="Field view: choose a survey">
          <LuxtrailMark className="h-6 text-white" />
        </Link>
        <div className="flex items-center gap-2">
          <UnitsToggle />
          <Link to={paths.home.to()} className="flex min-h-11 items-center gap-1 rounded-lg px-2 text-sm font-semibold text-white"><ArrowLeft className="h-4 w-4" aria-hidden />App</Link>
        </div>
      </header>
      <main id="main"><Outlet context={user} /></main>
    </div>
  );
}
