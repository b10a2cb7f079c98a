import type { ReactNode } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { AlertTriangle, Inbox, Loader2, RotateCw } from 'lucide-react';
import { ApiRequestError } from '@/lib/api-client';
import { Button } from './button';

export function Spinner({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center justify-center gap-2 py-10 text-sm text-ink-500">
      <Loader2 className="h-5 w-5 animate-spin text-lamp-500" aria-hidden />
      <span>{label}</span>
    </div>
  );
}

export function EmptyState({ title, children, action, icon }: { title: string; children?: ReactNode; action?: ReactNode; icon?: ReactNode }) {
  return (
    <div className="flex flex-col items-center justify-center gap-2 px-6 py-12 text-center">
      <div className="rounded-full bg-ink-100 p-3 text-ink-500">{icon ?? <Inbox className="h-6 w-6" aria-hidden />}</div>
      <h3 className="text-sm font-semibold text-ink-900">{title}</h3>
      {children && <div className="max-w-md text-sm text-ink-500">{children}</div>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}

export function ErrorState({ error, onRetry, title = 'This could not be loaded' }: { error: unknown; onRetry?: () => void; title?: string }) {
  const message = error instanceof Error ? error.message : 'Unknown error';
  const status = error instanceof ApiRequestError ? error.status : null;
  return (
    <div role="alert" className="flex flex-col items-center justify-center gap-2 px-6 py-10 text-center">
      <div className="rounded-full bg-short-50 p-3 text-short-600"><AlertTriangle className="h-6 w-6" aria-hidden /></div>
      <h3 className="text-sm font-semibold text-ink-900">{status === 404 ? 'Not found' : status === 403 ? 'Not allowed' : title}</h3>
      <p className="max-w-md text-sm text-ink-600">{message}</p>
      {onRetry && status !== 404 && status !== 403 && (
        <Button variant="secondary" size="sm" onClick={onRetry}><RotateCw className="h-4 w-4" aria-hidden />Try again</Button>
      )}
    </div>
  );
}

/**
 * Renders a query's loading and error states, and an empty state when `isEmpty` says so;
 * otherwise its children with the data.
 */
export function QueryState<T>({ query, children, isEmpty, empty, loadingLabel }: {
  query: UseQueryResult<T>;
  children: (data: T) => ReactNode;
  isEmpty?: (data: T) => boolean;
  empty?: ReactNode;
  loadingLabel?: string;
}) {
  if (query.isPending) return <Spinner label={loadingLabel} />;
  if (query.isError) return <ErrorState error={query.error} onRetry={() => query.refetch()} />;
  if (isEmpty?.(query.data)) return <>{empty ?? <EmptyState title="Nothing here yet" />}</>;
  return <>{children(query.data)}</>;
}
