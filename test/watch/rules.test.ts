import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { applyChannelOverrides } from '../../src/watch/rules/channelOverrides.ts';
import { formatConfigProblem } from '../../src/watch/rules/configProblem.ts';
import { loadRulesFile, rulesFromYaml } from '../../src/watch/rules/loadRules.ts';
import { RULE_IDS, type Rule } from '../../src/watch/rules/rule.ts';

async function defaultRules(): Promise<Rule[]> {
  const result = await loadRulesFile();
  if (!result.ok) throw new Error(result.problems.map(formatConfigProblem).join('\n'));
  return result.rules;
}

function yamlWith(rules: Rule[], change: (entries: Record<string, Record<string, unknown>>) => void): string {
  const entries: Record<string, Record<string, unknown>> = {};
  for (const rule of rules) entries[rule.id] = { name: rule.name, severity: rule.severity, threshold: rule.threshold, hysteresis: rule.hysteresis, unit: rule.unit };
  change(entries);
  // JSON is YAML: a quick way to write a well-formed variant.
  return JSON.stringify({ rules: entries });
}

describe('the shipped rules file', () => {
  it('loads, with every rule and the headline rule as a warning', async () => {
    const rules = await defaultRules();
    expect(rules.map((rule) => rule.id)).toEqual([...RULE_IDS]);
    const headline = rules.find((rule) => rule.id === 'mixing-reaches-dry-layer')!;
    // Coupling (DESIGN.md): the mixing height at or above the layer's base, so the margin threshold is 0 m.
    expect(headline).toMatchObject({ severity: 'warning', threshold: 0, unit: 'm', enabled: true });
    // Defaults from memory, as the file documents: C-Haines 10, min RH 15 %, transport wind 9 m/s, deep mixing 3000 m.
    expect(rules.find((rule) => rule.id === 'c-haines-above')!.threshold).toBe(10);
    expect(rules.find((rule) => rule.id === 'mixed-layer-rh-below')!.threshold).toBe(15);
    expect(rules.find((rule) => rule.id === 'transport-wind-above')!.threshold).toBe(9);
    expect(rules.find((rule) => rule.id === 'effective-mixing-height-above')!.threshold).toBe(3000);
  });
});

describe('a bad rules file names the file, the key and the reason', () => {
  it('a value of the wrong type', async () => {
    const rules = await defaultRules();
    const result = rulesFromYaml(yamlWith(rules, (e) => (e['hdw-above'].threshold = 'high')), 'config/rules.yaml');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0]).toMatchObject({ file: 'config/rules.yaml', key: 'rules.hdw-above.threshold' });
    expect(formatConfigProblem(result.problems[0])).toMatch(/^config\/rules\.yaml: rules\.hdw-above\.threshold: .*number/);
  });

  it('a misspelt key', async () => {
    const rules = await defaultRules();
    const result = rulesFromYaml(yamlWith(rules, (e) => (e['pft-below'].hysterisis = 5)), 'rules.yaml');
    expect(!result.ok && result.problems[0].key).toBe('rules.pft-below.hysterisis');
  });

  it('an unknown rule, a missing rule, a wrong unit, a threshold out of range', async () => {
    const rules = await defaultRules();
    const result = rulesFromYaml(
      yamlWith(rules, (e) => {
        e['haines-above'] = { ...e['hdw-above'] };
        delete e['transport-wind-above'];
        e['mixed-layer-rh-below'].unit = 'fraction';
        e['c-haines-above'].threshold = 14;
      }),
      'rules.yaml',
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const byKey = Object.fromEntries(result.problems.map((problem) => [problem.key, problem.reason]));
    expect(byKey['rules.haines-above']).toMatch(/no such rule/);
    expect(byKey['rules.transport-wind-above']).toMatch(/missing/);
    expect(byKey['rules.mixed-layer-rh-below.unit']).toMatch(/must be "%"/);
    expect(byKey['rules.c-haines-above.threshold']).toMatch(/from 0 to 13/);
  });

  it('broken YAML names the line', () => {
    const result = rulesFromYaml('rules:\n  hdw-above:\n    threshold: [250\n', 'rules.yaml');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0].file).toBe('rules.yaml');
    expect(result.problems[0].key).toMatch(/^line \d+/);
  });

  it('a missing file is a problem, not a crash', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'lapsewatch-rules-'));
    const result = await loadRulesFile(join(folder, 'absent.yaml'), 'absent.yaml');
    expect(result).toEqual({ ok: false, problems: [{ file: 'absent.yaml', key: '(file)', reason: 'file not found' }] });
    const path = join(folder, 'empty.yaml');
    await writeFile(path, '');
    const empty = await loadRulesFile(path, 'empty.yaml');
    expect(!empty.ok && empty.problems[0].key).toBe('(top level)');
  });
});

describe('channel overrides', () => {
  it('merge over the defaults without changing them', async () => {
    const defaults = await defaultRules();
    const before = structuredClone(defaults);
    const result = applyChannelOverrides(defaults, { 'hdw-above': { threshold: 180 }, 'plume-cloud-possible': { enabled: false } });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.rules.find((rule) => rule.id === 'hdw-above')).toMatchObject({ threshold: 180, hysteresis: 20 });
    expect(result.rules.find((rule) => rule.id === 'plume-cloud-possible')!.enabled).toBe(false);
    expect(defaults).toEqual(before);
  });

  it('an unknown rule id or an out-of-range value is an error value, and nothing is merged', async () => {
    const defaults = await defaultRules();
    const result = applyChannelOverrides(defaults, {
      'hdw-abov': { threshold: 180 },
      'mixed-layer-rh-below': { threshold: 120 },
      'transport-wind-above': { hysteresis: -1 },
    });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toHaveLength(3);
    expect(result.errors[0]).toMatch(/"hdw-abov": no such rule/);
    expect(result.errors[1]).toMatch(/"mixed-layer-rh-below", threshold: must be a number from 0 to 100 %, got 120/);
    expect(result.errors[2]).toMatch(/"transport-wind-above", hysteresis/);
  });
});
