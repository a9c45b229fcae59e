import type { RuleSeverity } from './rule.ts';

/** Rule severities, most severe first: the order in which alerts of one hour are listed. */
export const SEVERITY_RANK: Readonly<Record<RuleSeverity, number>> = { warning: 0, watch: 1, info: 2 };

/** The most severe of `severities`; 'info' when there are none. */
export function mostSevere(severities: Iterable<RuleSeverity>): RuleSeverity {
  let worst: RuleSeverity = 'info';
  for (const severity of severities) if (SEVERITY_RANK[severity] < SEVERITY_RANK[worst]) worst = severity;
  return worst;
}
