import { z } from 'zod';

export const ruleSeveritySchema = z.enum(['info', 'watch', 'warning']);

/** One rule's entry in config/rules.yaml. Strict: a misspelt key is an error, not silently ignored. */
export const ruleEntrySchema = z.strictObject({
  name: z.string().trim().min(1, 'the name is empty; give the rule a plain-words name').max(120, 'the name is longer than 120 characters'),
  severity: ruleSeveritySchema,
  threshold: z.number().finite(),
  hysteresis: z.number().finite().min(0, 'hysteresis cannot be negative; use 0 for none'),
  unit: z.string().min(1),
  enabled: z.boolean().optional(),
});

/** The file's outline; each entry is then checked on its own so one bad rule does not hide another's problems. */
export const rulesFileSchema = z.strictObject({
  rules: z.record(z.string(), z.unknown()),
});

export type RuleEntry = z.infer<typeof ruleEntrySchema>;
