import { AlertCircle } from 'lucide-react';

/** A mutation's error, shown above a form's submit button. */
export function FormError({ error }: { error: unknown }) {
  if (!error) return null;
  const message = error instanceof Error ? error.message : 'Something went wrong';
  return (
    <div role="alert" className="flex items-start gap-2 rounded-lg bg-short-50 px-3 py-2 text-sm text-short-700 ring-1 ring-inset ring-short-100">
      <AlertCircle className="mt-0.5 h-4 w-4 shrink-0" aria-hidden />
      <span>{message}</span>
    </div>
  );
}
