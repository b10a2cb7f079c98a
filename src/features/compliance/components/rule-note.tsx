import { Scale } from 'lucide-react';
import type { DecisionRule } from '@shared/schemas/organization';

/** The decision rule, printed wherever verdicts are shown (its text names it, so no label is repeated before it). */
export function RuleNote({ rule, ruleText, frozen }: { rule: DecisionRule; ruleText: string; frozen?: boolean }) {
  return (
    <p className="flex items-start gap-2 rounded-lg bg-ink-50 px-3 py-2 text-xs text-ink-700 ring-1 ring-inset ring-ink-100" data-testid="rule-note">
      <Scale className="mt-0.5 h-4 w-4 shrink-0 text-ink-500" aria-hidden />
      <span data-rule={rule}><strong className="font-semibold text-ink-900">Decision rule{frozen ? ', frozen at sign-off' : ''}:</strong> {ruleText}</span>
    </p>
  );
}
