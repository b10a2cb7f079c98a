import { TriangleAlert } from 'lucide-react';
import { EMERGENCY_CAUTIONS } from '@shared/schemas/emergency';

/** Shown wherever emergency lighting is drawn, judged or reported (DOMAIN.md section 7). */
export function EmergencyCaution() {
  return (
    <aside className="flex gap-3 rounded-xl bg-lamp-50 p-4 text-sm text-lamp-900 ring-1 ring-lamp-200" data-testid="emergency-caution">
      <TriangleAlert className="h-5 w-5 shrink-0 text-lamp-600" aria-hidden />
      <p>{EMERGENCY_CAUTIONS.join(' ')}</p>
    </aside>
  );
}
