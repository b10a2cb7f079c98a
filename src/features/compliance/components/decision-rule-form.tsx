import { useState } from 'react';
import { DECISION_RULE_LABELS, DECISION_RULES, type DecisionRule, type Organization } from '@shared/schemas/organization';
import { RULE_TEXT } from '@shared/core/decision';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-error';
import { useUpdateOrganization } from '../api/update-organization';

/** Chooses simple acceptance or the guarded rule (ILAC-G8:2019) for verdicts not yet signed off. */
export function DecisionRuleForm({ organization }: { organization: Organization }) {
  const update = useUpdateOrganization();
  const [rule, setRule] = useState<DecisionRule>(organization.decisionRule);
  return (
    <form className="space-y-4" onSubmit={(e) => { e.preventDefault(); update.mutate({ decisionRule: rule }); }}>
      <fieldset>
        <legend className="text-sm font-medium text-ink-800">Decision rule for verdicts</legend>
        <div className="mt-2 space-y-2">
          {DECISION_RULES.map((r) => (
            <label key={r} className="flex cursor-pointer gap-3 rounded-lg p-3 ring-1 ring-ink-200 has-[:checked]:bg-lamp-50 has-[:checked]:ring-lamp-400">
              <input type="radio" name="decisionRule" value={r} checked={rule === r} onChange={() => setRule(r)} className="mt-1" />
              <span>
                <span className="block text-sm font-semibold text-ink-900">{DECISION_RULE_LABELS[r]}</span>
                <span className="block text-sm text-ink-600">{RULE_TEXT[r]}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      <p className="text-xs text-ink-500">Signed-off surveys keep the rule they were judged with; the change applies to every other survey at once.</p>
      <FormError error={update.error} />
      {update.isSuccess && !update.isPending && <p role="status" className="text-sm text-meets-700">Saved: {DECISION_RULE_LABELS[update.data.decisionRule]}.</p>}
      <Button type="submit" busy={update.isPending} disabled={rule === organization.decisionRule}>Save rule</Button>
    </form>
  );
}
