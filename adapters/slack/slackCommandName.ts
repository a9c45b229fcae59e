import { readFileSync } from 'node:fs';
import { parse } from 'yaml';
import { z } from 'zod';
import { packagePath } from '../../src/packageRoot.ts';

/** The manifest is the one place the command is named; Slack and Discord both read it from here. */
export const slackManifestPath = packagePath('adapters', 'slack', 'manifest.yaml');

const manifestSchema = z.object({
  display_information: z.object({ name: z.string().min(1) }),
  features: z.object({
    slash_commands: z
      .array(
        z.object({
          command: z.string().regex(/^\/[a-z0-9_-]{1,31}$/, 'a slash, then 1-31 lower-case letters, digits, - or _'),
          usage_hint: z.string().optional(),
          description: z.string().min(1),
        }),
      )
      .length(1, 'Lapsewatch has exactly one slash command'),
  }),
});

export type SlackManifest = z.infer<typeof manifestSchema>;

let cached: SlackManifest | undefined;

/** Reads and checks the manifest once; a broken manifest stops start-up with the reason. */
export function readSlackManifest(path: string = slackManifestPath): SlackManifest {
  if (path === slackManifestPath && cached) return cached;
  const parsed = manifestSchema.safeParse(parse(readFileSync(path, 'utf8')));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new Error(`${path}: ${issue?.path.join('.') ?? ''}: ${issue?.message ?? 'invalid manifest'}`);
  }
  if (path === slackManifestPath) cached = parsed.data;
  return parsed.data;
}

/** The slash command with its slash, e.g. "/lapse". */
export function slackCommandName(): string {
  return readSlackManifest().features.slash_commands[0]!.command;
}

/** The app's name as the workspace shows it, e.g. for "/invite @Lapsewatch". */
export function slackAppName(): string {
  return readSlackManifest().display_information.name;
}

/** The command's description, reused for the Discord command so both platforms say the same. */
export function slackCommandDescription(): string {
  return readSlackManifest().features.slash_commands[0]!.description;
}
