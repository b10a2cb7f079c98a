import { Link } from 'react-router';
import { Compass } from 'lucide-react';
import { paths } from '@shared/paths';

export function NotFoundRoute() {
  return (
    <div className="flex min-h-[60vh] flex-col items-center justify-center gap-3 px-6 text-center">
      <Compass className="h-10 w-10 text-lamp-500" aria-hidden />
      <h1 className="text-xl font-semibold">There is no page at this address</h1>
      <p className="text-sm text-ink-600">The link may be old, or the record was removed.</p>
      <Link to={paths.home.to()} className="text-sm font-medium text-lamp-700 underline">Go to the overview</Link>
    </div>
  );
}
