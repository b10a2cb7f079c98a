import type { ReactNode } from 'react';
import { ShieldAlert } from 'lucide-react';
import { Link } from 'react-router';
import { can, type Capability } from '@shared/policy';
import { useCurrentUser } from './current-user';
import { Page } from '@/components/ui/page';
import { paths } from '@shared/paths';

/** Shows its children only to roles holding the capability; others get a clear refusal. */
export function Gate({ capability, children }: { capability: Capability; children: ReactNode }) {
  const user = useCurrentUser();
  if (can(user.role, capability)) return <>{children}</>;
  return (
    <Page>
      <div role="alert" className="mx-auto mt-16 max-w-md rounded-xl bg-white p-8 text-center shadow-card ring-1 ring-ink-100">
        <ShieldAlert className="mx-auto h-10 w-10 text-short-500" aria-hidden />
        <h1 className="mt-3 text-lg font-semibold">This page is not open to your role</h1>
        <p className="mt-2 text-sm text-ink-600">Ask an administrator of your organisation if you need access.</p>
        <Link to={paths.home.to()} className="mt-4 inline-block text-sm font-medium text-lamp-700 underline">Back to the overview</Link>
      </div>
    </Page>
  );
}
