import { readFile } from 'node:fs/promises';
import { parseDocument } from 'yaml';
import type { z } from 'zod';
import { ruleValueProblems } from './checkRuleValues.ts';
import type { ConfigProblem } from './configProblem.ts';
import { RULE_IDS, isRuleId, type Rule } from './rule.ts';
import { RULE_MEASURES } from './ruleCatalogue.ts';
import { ruleEntrySchema, rulesFileSchema } from './rulesFileSchema.ts';
import { packagePath } from '../../packageRoot.ts';

export type RulesResult = { ok: true; rules: Rule[] } | { ok: false; problems: ConfigProblem[] };

/** The defaults shipped with the project. */
export const DEFAULT_RULES_PATH = packagePath('config', 'rules.yaml');

/**
 * Reads rules from YAML text. `fileLabel` names the file in every problem. Every known rule must be
 * present (a rule missing from the file would be a silent all-clear); unknown ids, wrong units and
 * out-of-range values are problems naming the key and the reason. Rules come out in catalogue order.
 */
export function rulesFromYaml(text: string, fileLabel: string): RulesResult {
  const document = parseDocument(text, { uniqueKeys: true });
  if (document.errors.length > 0) {
    return {
      ok: false,
      problems: document.errors.map((error) => ({
        file: fileLabel,
        key: error.linePos ? `line ${error.linePos[0].line}` : '(file)',
        reason: `not valid YAML: ${error.message.split('\n')[0]}`,
      })),
    };
  }
  const parsed = rulesFileSchema.safeParse(document.toJS());
  if (!parsed.success) return { ok: false, problems: parsed.error.issues.map((issue) => problemOf(issue, [], fileLabel)) };

  const problems: ConfigProblem[] = [];
  const rules: Rule[] = [];
  const entries = parsed.data.rules;
  for (const id of Object.keys(entries)) {
    if (!isRuleId(id)) problems.push({ file: fileLabel, key: `rules.${id}`, reason: `no such rule; known rules are ${RULE_IDS.join(', ')}` });
  }
  for (const id of RULE_IDS) {
    if (!Object.hasOwn(entries, id)) {
      problems.push({ file: fileLabel, key: `rules.${id}`, reason: 'missing; every rule needs its defaults (set enabled: false to turn one off)' });
      continue;
    }
    const checked = ruleEntrySchema.safeParse(entries[id]);
    if (!checked.success) {
      problems.push(...checked.error.issues.map((issue) => problemOf(issue, ['rules', id], fileLabel)));
      continue;
    }
    const entry = checked.data;
    const measure = RULE_MEASURES[id];
    if (entry.unit !== measure.unit) {
      problems.push({ file: fileLabel, key: `rules.${id}.unit`, reason: `must be "${measure.unit}" (the unit this rule reads), got "${entry.unit}"` });
    }
    for (const problem of ruleValueProblems(id, entry)) {
      problems.push({ file: fileLabel, key: `rules.${id}.${problem.field}`, reason: problem.reason });
    }
    rules.push({
      id,
      name: entry.name,
      severity: entry.severity,
      threshold: entry.threshold,
      hysteresis: entry.hysteresis,
      unit: measure.unit,
      enabled: entry.enabled ?? true,
    });
  }
  return problems.length > 0 ? { ok: false, problems } : { ok: true, rules };
}

/** A zod issue as a problem with a dotted key; unknown keys are named one by one. */
function problemOf(issue: z.core.$ZodIssue, prefix: string[], fileLabel: string): ConfigProblem {
  const path = [...prefix, ...issue.path.map(String)].join('.');
  if (issue.code === 'unrecognized_keys') {
    return {
      file: fileLabel,
      key: [path, issue.keys[0]].filter(Boolean).join('.'),
      reason: `unknown key${issue.keys.length > 1 ? `s ${issue.keys.join(', ')}` : ''}; allowed keys are ${prefix.length > 0 ? 'name, severity, threshold, hysteresis, unit, enabled' : 'rules'}`,
    };
  }
  if (path === '') return { file: fileLabel, key: '(top level)', reason: `${issue.message}; the file needs a top-level "rules:" map` };
  return { file: fileLabel, key: path, reason: issue.message };
}

/** Reads and checks a rules file; an unreadable file is a problem naming it, not a crash. */
export async function loadRulesFile(path: string = DEFAULT_RULES_PATH, fileLabel: string = path): Promise<RulesResult> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    return { ok: false, problems: [{ file: fileLabel, key: '(file)', reason: code === 'ENOENT' ? 'file not found' : `cannot be read (${code ?? String(error)})` }] };
  }
  return rulesFromYaml(text, fileLabel);
}
