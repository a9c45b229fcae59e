// One command name on both platforms, read from the Slack manifest; registration goes over REST.
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { readFileSync } from 'node:fs';
import { discordCommandDefinitions, discordCommandName } from '../../adapters/discord/commands.ts';
import { registerDiscordCommands } from '../../adapters/discord/registerCommands.ts';
import { readSlackManifest, slackCommandName, slackManifestPath } from '../../adapters/slack/slackCommandName.ts';
import { DiscordStandIn, standInApplicationId, standInGuildId, startDiscordStandIn } from './discordStandIn.ts';

const run = promisify(execFile);

describe('command names', () => {
  it('Slack listens for the command the manifest declares', () => {
    const manifest = parse(readFileSync(slackManifestPath, 'utf8'));
    expect(slackCommandName()).toBe(manifest.features.slash_commands[0].command);
    expect(slackCommandName()).toMatch(/^\/[a-z]+$/);
  });

  it('the manifest asks for the scopes the adapter uses and has interactivity and Socket Mode', () => {
    const manifest = parse(readFileSync(slackManifestPath, 'utf8'));
    expect(manifest.oauth_config.scopes.bot).toEqual(expect.arrayContaining(['commands', 'chat:write', 'files:write']));
    expect(manifest.settings.interactivity.is_enabled).toBe(true);
    expect(typeof manifest.settings.socket_mode_enabled).toBe('boolean');
    expect(manifest.features.slash_commands[0].usage_hint).toBeTruthy();
  });

  it('Discord registers the same name with one free-text option', () => {
    expect(discordCommandName()).toBe(slackCommandName().slice(1));
    const [command] = discordCommandDefinitions();
    expect(command?.name).toBe(discordCommandName());
    expect(command?.description.length).toBeLessThanOrEqual(100);
    expect(command?.options).toEqual([expect.objectContaining({ name: 'text', type: 3, required: false })]);
  });

  it('a broken manifest is refused with the file, the key and the reason', () => {
    const dir = mkdtempSync(join(tmpdir(), 'lapsewatch-manifest-'));
    const path = join(dir, 'manifest.yaml');
    writeFileSync(path, 'display_information: { name: X }\nfeatures:\n  slash_commands:\n    - command: lapse\n      description: d\n');
    expect(() => readSlackManifest(path)).toThrow(/manifest\.yaml: features\.slash_commands\.0\.command: a slash/);
  });
});

describe('Discord command registration', () => {
  let standIn: DiscordStandIn;
  beforeAll(async () => {
    standIn = await startDiscordStandIn();
  });
  afterAll(async () => standIn?.stop());

  it('registers for a guild with a bulk PUT', async () => {
    const result = await registerDiscordCommands({ token: 't', applicationId: standInApplicationId, guildId: standInGuildId, apiUrl: standIn.apiUrl });
    expect(result).toEqual({ scope: 'guild', names: [discordCommandName()] });
    const put = standIn.callsTo(new RegExp(`/applications/${standInApplicationId}/guilds/${standInGuildId}/commands$`)).at(-1);
    expect(put?.method).toBe('PUT');
    expect(put?.body).toEqual(discordCommandDefinitions());
  });

  it('the script registers globally from environment variables', async () => {
    const { stdout } = await run(process.execPath, ['--import', 'tsx', 'scripts/register-discord-commands.ts'], {
      env: { ...process.env, DISCORD_TOKEN: 'invented', DISCORD_APPLICATION_ID: standInApplicationId, DISCORD_GUILD_ID: '', DISCORD_API_URL: standIn.apiUrl },
      timeout: 20_000,
    });
    expect(stdout).toContain(`registered /${discordCommandName()} (global)`);
    expect(standIn.callsTo(new RegExp(`^/api/v10/applications/${standInApplicationId}/commands$`))).toHaveLength(1);
  });

  it('the script says what is missing and exits 2', async () => {
    const failed = await run(process.execPath, ['--import', 'tsx', 'scripts/register-discord-commands.ts'], {
      env: { ...process.env, DISCORD_TOKEN: '', DISCORD_APPLICATION_ID: 'not-digits', DISCORD_API_URL: standIn.apiUrl },
      timeout: 20_000,
    }).then(
      () => null,
      (error: { code: number; stderr: string }) => error,
    );
    expect(failed?.code).toBe(2);
    expect(failed?.stderr).toContain('DISCORD_TOKEN');
    expect(failed?.stderr).toContain('DISCORD_APPLICATION_ID');
  });
});
