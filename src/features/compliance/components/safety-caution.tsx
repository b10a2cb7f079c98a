import { TriangleAlert } from 'lucide-react';

/** DOMAIN.md section 7: shown where verdicts and reports are produced. */
export function SafetyCaution() {
  return (
    <aside className="flex gap-3 rounded-xl bg-lamp-50 p-4 text-sm text-lamp-900 ring-1 ring-lamp-200">
      <TriangleAlert className="h-5 w-5 shrink-0 text-lamp-600" aria-hidden />
      <p>These verdicts support decisions; they do not certify emergency lighting or replace a qualified lighting professional. Local codes and regulations take precedence over the generic targets of the library, above all on stairs, exits, emergency routes and around machinery.</p>
    </aside>
  );
}
