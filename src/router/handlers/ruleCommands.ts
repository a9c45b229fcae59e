import type { Message } from '../../render/message.ts';
import { ruleValueProblems } from '../../watch/rules/checkRuleValues.ts';
import { isRuleId, RULE_IDS } from '../../watch/rules/rule.ts';
import { errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import type { HandlerContext } from '../routerContext.ts';

export async function listRules(context: HandlerContext): Promise<Message> {
  const overrides = new Map((await context.store.rules.listOverrides(context.channel.id)).map((override) => [override.ruleId, override]));
  const mutes = await context.store.rules.listActiveMutes(context.channel.id, context.nowMs());
  const lines = context.defaultRules.map((rule) => {
    const override = overrides.get(rule.id);
    const threshold = override
      ? `${override.thresholdValue} ${rule.unit} (this channel; default ${rule.threshold})`
      : `${rule.threshold} ${rule.unit}`;
    const state = rule.enabled ? rule.severity : 'off';
    return `\`${rule.id}\` ${rule.name}: ${threshold} [${state}]`;
  });
  for (const mute of mutes) lines.push(`muted: \`${mute.ruleId}\` at ${mute.locationKey} until ${new Date(mute.untilMs).toISOString().slice(0, 16)}Z`);
  return noticeMessage('Alert rules', [...lines, 'Change one for this channel: `threshold hdw-above 300`; back to the default: `threshold hdw-above default`.'], context.localFooterLine);
}

export async function setThreshold(context: HandlerContext, ruleId: string, value: number | 'default'): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const rule = context.defaultRules.find((candidate) => candidate.id === ruleId);
  if (!isRuleId(ruleId) || !rule) {
    return errorMessage(`There is no rule "${ruleId}". Rules: ${RULE_IDS.join(', ')}. Nothing was changed.`, context.localFooterLine);
  }
  if (value === 'default') {
    const cleared = await context.store.rules.clearOverride(context.channel.id, ruleId);
    return noticeMessage(cleared ? `${rule.name}: back to the default ${rule.threshold} ${rule.unit}.` : `${rule.name} already uses the default ${rule.threshold} ${rule.unit}.`, [], context.localFooterLine);
  }
  const problems = ruleValueProblems(ruleId, { threshold: value });
  if (problems.length > 0) {
    return errorMessage(`"${ruleId}" threshold ${problems[0].reason}. Nothing was changed. Try \`threshold ${ruleId} ${rule.threshold}\`.`, context.localFooterLine);
  }
  await context.store.rules.setOverride(context.channel.id, ruleId, value, null, context.nowMs());
  return noticeMessage(`${rule.name}: threshold ${value} ${rule.unit} for this channel (default ${rule.threshold}).`, [], context.localFooterLine);
}
