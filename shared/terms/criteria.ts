/** The kinds of pass/fail rule, without zod (the web app's first load). */
export const ruleKinds = [
  'max_char_length_mm',
  'max_afterflame_s',
  'max_afterglow_s',
  'no_flaming_drips',
  'max_mass_loss_pct',
  'max_burn_rate_mm_per_min',
  'max_afterflame_plus_afterglow_s',
  'no_burn_to_clamp',
] as const;
export type RuleKind = (typeof ruleKinds)[number];

export const ruleScopes = ['each', 'average'] as const;
export type RuleScope = (typeof ruleScopes)[number];

/** The yes/no rules: they have no limit and look at every specimen. */
export const yesNoRuleKinds = ['no_flaming_drips', 'no_burn_to_clamp'] as const;

export function ruleNeedsLimit(kind: RuleKind): boolean {
  return !(yesNoRuleKinds as readonly RuleKind[]).includes(kind);
}
