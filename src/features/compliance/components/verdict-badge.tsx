import { CircleCheck, CircleHelp, CircleMinus, CircleX } from 'lucide-react';
import { Badge, type Tone } from '@/components/ui/badge';
import { VERDICT_LABELS, type ZoneVerdict } from '@shared/schemas/compliance';

const TONE: Record<ZoneVerdict, Tone> = { meets: 'good', falls_short: 'bad', inconclusive: 'unsure', not_assessed: 'neutral' };
const ICON = { meets: CircleCheck, falls_short: CircleX, inconclusive: CircleHelp, not_assessed: CircleMinus } as const;

/** Verdict colours come with a label and an icon, never colour alone. */
export function VerdictBadge({ verdict }: { verdict: ZoneVerdict }) {
  const Icon = ICON[verdict];
  return <Badge tone={TONE[verdict]} icon={<Icon className="h-3.5 w-3.5" aria-hidden />}>{VERDICT_LABELS[verdict]}</Badge>;
}

/** Fill colours for the plan (tailwind.config.ts verdict tones), paired with the verdict label on the map. */
export const VERDICT_FILL: Record<ZoneVerdict, string> = { meets: '#1b9e77', falls_short: '#c2185b', inconclusive: '#6a51a3', not_assessed: '#9eabcb' };
