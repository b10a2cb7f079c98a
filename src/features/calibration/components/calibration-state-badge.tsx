import { AlertTriangle, CheckCircle2, CircleSlash, Clock } from 'lucide-react';
import type { CalibrationState } from '@shared/schemas/probes';
import { Badge } from '@/components/ui/badge';

export const CALIBRATION_STATE_LABELS: Record<CalibrationState, string> = {
  ok: 'In calibration',
  due_soon: 'Due soon',
  overdue: 'Overdue',
  no_approved_set: 'No approved set',
};

/** The state with an icon and a word, never colour alone. */
export function CalibrationStateBadge({ state }: { state: CalibrationState }) {
  const icon = { ok: CheckCircle2, due_soon: Clock, overdue: AlertTriangle, no_approved_set: CircleSlash }[state];
  const Icon = icon;
  const tone = state === 'ok' ? 'good' : state === 'due_soon' ? 'warn' : state === 'overdue' ? 'bad' : 'unsure';
  return <Badge tone={tone} icon={<Icon className="h-3.5 w-3.5" aria-hidden />}>{CALIBRATION_STATE_LABELS[state]}</Badge>;
}
