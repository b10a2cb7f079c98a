import { CircleCheck, CircleHelp, CircleMinus, CircleX } from 'lucide-react';
import { Badge, type Tone } from '@/components/ui/badge';

export type EmergencyVerdictKind = 'meets' | 'falls_short' | 'inconclusive' | 'not_judged';

export const EMERGENCY_VERDICT_LABELS: Record<EmergencyVerdictKind, string> = { meets: 'Meets', falls_short: 'Falls short', inconclusive: 'Inconclusive', not_judged: 'Not judged' };
const TONE: Record<EmergencyVerdictKind, Tone> = { meets: 'good', falls_short: 'bad', inconclusive: 'unsure', not_judged: 'neutral' };
const ICON = { meets: CircleCheck, falls_short: CircleX, inconclusive: CircleHelp, not_judged: CircleMinus } as const;
/** Map colours of the verdicts (the verdict tones of tailwind.config.ts), always beside a label. */
export const EMERGENCY_VERDICT_COLOUR: Record<EmergencyVerdictKind, string> = { meets: '#1b9e77', falls_short: '#c2185b', inconclusive: '#6a51a3', not_judged: '#9eabcb' };

/** A verdict with its label and icon, never colour alone. */
export function EmergencyVerdictBadge({ verdict }: { verdict: EmergencyVerdictKind }) {
  const Icon = ICON[verdict];
  return <Badge tone={TONE[verdict]} icon={<Icon className="h-3.5 w-3.5" aria-hidden />}>{EMERGENCY_VERDICT_LABELS[verdict]}</Badge>;
}
