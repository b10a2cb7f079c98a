import { z } from 'zod';
import { GRID_ROUNDINGS } from '../spatial/measurement-grid';

export const DECISION_RULES = ['simple', 'guarded'] as const;
export type DecisionRule = (typeof DECISION_RULES)[number];

export const DECISION_RULE_LABELS: Record<DecisionRule, string> = {
  simple: 'Simple acceptance',
  guarded: 'Guarded acceptance (guard band = expanded uncertainty U)',
};

export const organizationSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  decisionRule: z.enum(DECISION_RULES),
  /** The rule in words (measurement core's RULE_TEXT), printed wherever a verdict is shown. */
  ruleText: z.string(),
  /** Default rounding of grid points per side for new surveys (each survey records its own). */
  gridRounding: z.enum(GRID_ROUNDINGS),
});
export type Organization = z.infer<typeof organizationSchema>;

export const updateOrganizationBodySchema = z.object({
  decisionRule: z.enum(DECISION_RULES, { message: 'Choose "simple" or "guarded"' }).optional(),
  gridRounding: z.enum(GRID_ROUNDINGS, { message: 'Choose "next_higher" or "nearest"' }).optional(),
}).refine((b) => b.decisionRule !== undefined || b.gridRounding !== undefined, { message: 'Send decisionRule or gridRounding' });
export type UpdateOrganizationBody = z.infer<typeof updateOrganizationBodySchema>;
