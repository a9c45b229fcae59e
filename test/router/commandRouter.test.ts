import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildForecastSource } from '../../src/app/buildForecastSource.ts';
import { parseAppConfig } from '../../src/config/appConfig.ts';
import { FileSource } from '../../src/forecast/fileSource.ts';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import type { Message } from '../../src/render/message.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { COMMAND_EXAMPLES } from '../../src/router/commandGrammar.ts';
import { createCommandRouter } from '../../src/router/createCommandRouter.ts';
import { CANNOT_POST_HERE, NEEDS_MANAGE_CHANNEL } from '../../src/router/replies.ts';
import type { RouterDependencies } from '../../src/router/routerContext.ts';
import type { CommandRequest, CommandRouter } from '../../src/router/routerTypes.ts';
import { openStore } from '../../src/store/openStore.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { loadRulesFile } from '../../src/watch/rules/loadRules.ts';

// The router against the real parts: a SQLite store in a temp folder, the demo source (invented data)
// and the shipped rules. Only the clock is fixed, so the answers are repeatable.
const NOW_MS = Date.parse('2026-08-14T15:00:00Z'); // 09:00 in the demo's time zone (America/Boise)

let folder: string;
let store: Store;
let dependencies: RouterDependencies;
let router: CommandRouter;
const faults: unknown[] = [];

function request(text: string, overrides: Partial<CommandRequest> = {}): CommandRequest {
  return { platform: 'terminal', teamId: '', channelId: 'ops', userId: 'fbann', text, canManageChannel: true, ...overrides };
}
const text = (message: Message) => encodeForTerminal(message, { color: false });

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'lapsewatch-router-'));
  store = await openStore({ url: `sqlite:${join(folder, 'store.db')}` });
  const config = parseAppConfig({}, 'test');
  if (!config.ok) throw new Error(config.error);
  const source = buildForecastSource(config.config.forecast, () => NOW_MS);
  const rules = await loadRulesFile();
  if (!rules.ok) throw new Error(JSON.stringify(rules.problems));
  dependencies = {
    store,
    source: source.source,
    forecastHours: 48,
    findNamedPlace: source.findNamedPlace,
    suggestedPlaceNames: source.suggestedPlaceNames,
    channelDefaults: { unitSystem: 'metric', summaryLocalTime: '06:30' },
    defaultRules: rules.rules,
    commandPrefix: () => '',
    nowMs: () => NOW_MS,
  };
  router = createCommandRouter(dependencies, (error) => faults.push(error));
});

afterAll(async () => {
  await store.close();
  rmSync(folder, { recursive: true, force: true });
});

describe('the command router', () => {
  it('answers help with every command and the footer', async () => {
    const message = await router.handleCommand(request('help'));
    const shown = text(message);
    for (const { example } of Object.values(COMMAND_EXAMPLES)) expect(shown).toContain(`\`${example}\``);
    expect(shown).toContain('`unmute hdw-above Cinder Ridge`');
    expect(message.footer).toContain(SAFETY_FOOTER);
  });

  it('looks up a demo place: coupling hour, chart, invented-data note and footer', async () => {
    const message = await router.handleCommand(request('Kestrel Bench ICP'));
    expect(message.kind).toBe('lookup');
    expect(message.inventedData).toBe(true);
    expect(message.images.length).toBeGreaterThan(0);
    expect(text(message)).toMatch(/Invented demo data/);
    expect(message.footer).toContain(SAFETY_FOOTER);
    expect(message.actions.map((action) => action.actionId)).toContain('show-detail');
    expect(faults).toEqual([]);
  });

  it('saves, lists and forgets a place; a second save under the same name changes nothing', async () => {
    expect((await router.handleCommand(request('save Cinder Ridge 44.81,-115.43'))).kind).toBe('notice');
    const again = await router.handleCommand(request('save cinder ridge 45,-116'));
    expect(again.kind).toBe('error');
    expect(again.title).toMatch(/already saved/);
    const channel = await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' });
    const places = await store.places.listPlaces(channel!.id);
    expect(places.map((place) => [place.name, place.latitudeDeg])).toEqual([['Cinder Ridge', 44.81]]);
    expect(text(await router.handleCommand(request('places')))).toContain('Cinder Ridge');
    expect((await router.handleCommand(request('forget Cinder Ridge'))).kind).toBe('notice');
    expect(await store.places.listPlaces(channel!.id)).toEqual([]);
  });

  it('watches and stops watching; a member who cannot manage the channel changes nothing', async () => {
    const refused = await router.handleCommand(request('watch Sawback Lookout', { canManageChannel: false }));
    expect(refused.kind).toBe('error');
    const channel = await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' });
    expect(await store.watches.listWatches(channel!.id)).toEqual([]);
    // Where the platform says the bot may not post (Discord's app permissions), alerts could never arrive.
    const cannotPost = await router.handleCommand(request('watch Sawback Lookout', { botCanPost: false }));
    expect(cannotPost.title).toBe(CANNOT_POST_HERE);
    expect(await store.watches.listWatches(channel!.id)).toEqual([]);
    const watching = await router.handleCommand(request('watch Sawback Lookout', { botCanPost: true }));
    expect(watching.title).toMatch(/Watching Sawback Lookout/);
    // The adapter is told the answer turned on posts, so it can check it may post there.
    expect(watching.postsToChannel).toBe(true);
    expect((await router.handleCommand(request('watching'))).postsToChannel).toBeUndefined();
    // A morning summary time is the same kind of change; turning summaries off is not.
    const channelNow = await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' });
    expect((await router.handleCommand(request('morning 05:45', { botCanPost: false }))).title).toBe(CANNOT_POST_HERE);
    expect((await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' }))!.summaryLocalTime).toBe(channelNow!.summaryLocalTime);
    expect((await router.handleCommand(request('morning 05:45'))).postsToChannel).toBe(true);
    expect((await router.handleCommand(request('morning off', { botCanPost: false }))).postsToChannel).toBeUndefined();
    await router.handleCommand(request(`morning ${channelNow!.summaryLocalTime ?? 'off'}`));
    expect(text(await router.handleCommand(request('watching')))).toContain('Sawback Lookout');
    expect((await router.handleCommand(request('unwatch Sawback Lookout'))).kind).toBe('notice');
    expect(await store.watches.listWatches(channel!.id)).toEqual([]);
  });

  it('changes a threshold within range and refuses one outside it without writing', async () => {
    const bad = await router.handleCommand(request('threshold hdw-above -5'));
    expect(bad.kind).toBe('error');
    expect(bad.title).toMatch(/Nothing was changed/);
    const channel = await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' });
    expect(await store.rules.listOverrides(channel!.id)).toEqual([]);
    const unknown = await router.handleCommand(request('threshold no-such-rule 5'));
    expect(unknown.title).toMatch(/There is no rule "no-such-rule"/);
    expect((await router.handleCommand(request('threshold hdw-above 250'))).kind).toBe('notice');
    expect((await store.rules.listOverrides(channel!.id)).map((override) => override.thresholdValue)).toEqual([250]);
    expect(text(await router.handleCommand(request('rules')))).toMatch(/250 .*this channel/);
  });

  it('answers questions from a channel never seen before without saving it; the first change saves it, and a removed channel asking again is active again', async () => {
    const fresh = { channelId: 'C-new-to-the-bot' };
    const target = { platform: 'terminal' as const, teamId: '', channelId: fresh.channelId };
    for (const question of ['Alder Sink', 'detail Alder Sink 15', 'places', 'watching', 'rules', 'help']) {
      expect((await router.handleCommand(request(question, fresh))).kind).not.toBe('error');
    }
    expect(await store.channels.findChannel(target)).toBeNull();
    expect(text(await router.handleCommand(request('Alder Sink', fresh)))).toMatch(/ m\b/); // the defaults: metric
    await router.handleCommand(request('units us', fresh));
    const saved = await store.channels.findChannel(target);
    expect([saved?.unitSystem, saved?.active]).toEqual(['us', true]);
    expect(text(await router.handleCommand(request('Alder Sink', fresh)))).toMatch(/ ft/);
    expect(text(await router.handleCommand(request('Alder Sink', fresh)))).not.toMatch(/Alerts here had stopped/);
    // The platform refused a post here: the outbox marked the channel inactive, its watches off.
    await store.channels.markChannelInactive(target, NOW_MS - 3 * 3_600_000);
    const first = text(await router.handleCommand(request('Alder Sink', fresh)));
    expect((await store.channels.findChannel(target))?.active).toBe(true);
    // The first answer after says so, once; the lookup itself is intact.
    expect(first).toMatch(/Alder Sink/);
    expect(first).toMatch(/Alerts here had stopped/);
    expect(first).toContain('Since 2026-08-14 12:00Z Lapsewatch could not post in this channel');
    expect(text(await router.handleCommand(request('Alder Sink', fresh)))).not.toMatch(/Alerts here had stopped/);
    // A button press can be the first, too.
    await store.channels.markChannelInactive(target, NOW_MS);
    const pressed = await router.handleAction({ platform: 'terminal', teamId: '', channelId: fresh.channelId, userId: 'fbann', actionId: 'mute-rule', value: 'hdw-above|44.3,-116.9', canManageChannel: true });
    expect(text(pressed)).toMatch(/Muted[\s\S]*Alerts here had stopped/);
    expect(faults).toEqual([]);
  });

  it('sets units and the morning time', async () => {
    await router.handleCommand(request('units us'));
    await router.handleCommand(request('morning 05:45'));
    const channel = await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' });
    expect([channel!.unitSystem, channel!.summaryLocalTime]).toEqual(['us', '05:45']);
    const lookup = await router.handleCommand(request('Alder Sink'));
    expect(text(lookup)).toMatch(/ ft/);
    await router.handleCommand(request('units metric'));
  });

  it('answers a malformed command with one line and a correct example', async () => {
    const message = await router.handleCommand(request('morning 27:99'));
    expect(message.kind).toBe('error');
    expect(message.title).toMatch(/Try: `morning 06:30`/);
  });

  it('follows the buttons: detail of one hour with the skew-T, and a six-hour mute', async () => {
    const lookup = await router.handleCommand(request('Kestrel Bench ICP'));
    const detailAction = lookup.actions.find((action) => action.actionId === 'show-detail')!;
    const detail = await router.handleAction({ platform: 'terminal', teamId: '', channelId: 'ops', userId: 'fbann', actionId: 'show-detail', value: detailAction.value, canManageChannel: true });
    expect(detail.kind).toBe('detail');
    expect(detail.table?.rows.length).toBeGreaterThanOrEqual(3);
    expect(detail.table?.rows.every((row) => /unstable|adiabatic|stable|inversion|isothermal/.test(row.join(' ')))).toBe(true);
    expect(detail.images.length).toBe(1);
    const mute = await router.handleAction({ platform: 'terminal', teamId: '', channelId: 'ops', userId: 'fbann', actionId: 'mute-rule', value: 'mixing-reaches-dry-layer|43.62,-115.48', canManageChannel: true });
    expect(mute.title).toMatch(/Muted/);
    const channel = await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId: 'ops' });
    expect(await store.rules.isMuted(channel!.id, 'mixing-reaches-dry-layer', '43.6200,-115.4800', NOW_MS + 5 * 3_600_000)).toBe(true);
    expect(await store.rules.isMuted(channel!.id, 'mixing-reaches-dry-layer', '43.6200,-115.4800', NOW_MS + 7 * 3_600_000)).toBe(false);
  });

  it('ends a mute early by command, at a place or everywhere, and changes nothing when it cannot', async () => {
    const channelId = 'unmute-ops';
    const at = (value: string) => router.handleAction({ platform: 'terminal', teamId: '', channelId, userId: 'fbann', actionId: 'mute-rule', value, canManageChannel: true });
    const notice = await at('hdw-above|43.62,-115.48');
    // The mute notice says how to end it, in a form the command takes, and has a button for it.
    const hint = /`(unmute [^`]+)`/.exec(text(notice))?.[1];
    expect(hint).toBe('unmute hdw-above 43.62,-115.48');
    expect(notice.actions).toEqual([{ actionId: 'end-mute', label: 'End this mute', value: 'hdw-above|43.62,-115.48' }]);
    await at('hdw-above|44.3,-116.9');
    await router.handleCommand(request('save Cinder Ridge 43.62,-115.48', { channelId }));
    const channel = (await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId }))!;
    const muted = (key: string) => store.rules.isMuted(channel.id, 'hdw-above', key, NOW_MS);

    const rules = text(await router.handleCommand(request('rules', { channelId })));
    expect(rules).toContain('`hdw-above` at Cinder Ridge until');
    expect(rules).toContain('`hdw-above` at 44.30°N 116.90°W until');

    const refused = await router.handleCommand(request(hint!, { channelId, canManageChannel: false }));
    expect(refused.kind).toBe('error');
    expect(await muted('43.6200,-115.4800')).toBe(true);
    const unknownRule = await router.handleCommand(request('unmute no-such-rule Cinder Ridge', { channelId }));
    expect(unknownRule.title).toMatch(/There is no rule "no-such-rule".*Nothing was changed/);
    const unknownPlace = await router.handleCommand(request('unmute hdw-above Nowhere Flat', { channelId }));
    expect(unknownPlace.kind).toBe('error');
    expect(unknownPlace.title).toMatch(/No place called "Nowhere Flat".*Nothing was changed/);
    expect(await muted('43.6200,-115.4800')).toBe(true);

    // Ending a mute turns the bot's posts back on: refused where the platform says it may not post.
    const cannotPost = await router.handleCommand(request('unmute hdw-above Cinder Ridge', { channelId, botCanPost: false }));
    expect(cannotPost.title).toBe(CANNOT_POST_HERE);
    expect(await muted('43.6200,-115.4800')).toBe(true);
    const byButton = await router.handleAction({ platform: 'discord', teamId: 'g', channelId: 'unmute-elsewhere', userId: 'fbann', actionId: 'end-mute', value: 'hdw-above|43.62,-115.48', canManageChannel: true, botCanPost: false });
    expect(byButton.title).toBe(CANNOT_POST_HERE);

    const ended = await router.handleCommand(request('unmute hdw-above Cinder Ridge', { channelId }));
    expect(ended.kind).toBe('notice');
    // The adapter is told the answer turned posts back on, so it can check it may post there.
    expect(ended.postsToChannel).toBe(true);
    expect(ended.title).toMatch(/alerts again at Cinder Ridge/);
    expect(text(ended)).toMatch(/still stand are posted here at the next alert check/);
    expect(await muted('43.6200,-115.4800')).toBe(false);
    expect(await muted('44.3000,-116.9000')).toBe(true);

    const again = await router.handleCommand(request('unmute hdw-above Cinder Ridge', { channelId }));
    expect(again.title).toMatch(/is not muted at Cinder Ridge in this channel\. Nothing was changed/);
    expect(text(again)).toContain('muted at 44.30°N 116.90°W until');

    const everywhere = await router.handleCommand(request('unmute hdw-above', { channelId }));
    expect(everywhere.title).toMatch(/alerts again everywhere in this channel/);
    expect(text(everywhere)).toContain('Mutes ended: 44.30°N 116.90°W.');
    expect(await muted('44.3000,-116.9000')).toBe(false);
    expect((await router.handleCommand(request('unmute hdw-above', { channelId }))).title).toMatch(/is not muted in this channel\. Nothing was changed/);
    expect(faults).toEqual([]);
  });

  it('mutes a rule by command at a saved place or a point, as the button does, and changes nothing when it cannot', async () => {
    const channelId = 'mute-ops';
    await router.handleCommand(request('save Cinder Ridge 43.62,-115.48', { channelId }));
    await router.handleCommand(request('watch Cinder Ridge', { channelId }));
    const channel = (await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId }))!;
    const muted = (ruleId: string, key: string, atMs = NOW_MS) => store.rules.isMuted(channel.id, ruleId, key, atMs);

    expect((await router.handleCommand(request('mute hdw-above Cinder Ridge', { channelId, canManageChannel: false }))).title).toBe(NEEDS_MANAGE_CHANNEL);
    expect((await router.handleCommand(request('mute no-such-rule Cinder Ridge', { channelId }))).title).toMatch(/There is no rule "no-such-rule".*Nothing was changed/);
    expect((await router.handleCommand(request('mute hdw-above Nowhere Flat', { channelId }))).title).toMatch(/No place called "Nowhere Flat".*Nothing was changed/);
    expect(await muted('hdw-above', '43.6200,-115.4800')).toBe(false);

    const notice = await router.handleCommand(request('mute hdw-above Cinder Ridge', { channelId }));
    expect(notice.kind).toBe('notice');
    expect(notice.title).toMatch(/^Muted "[^"]+" at Cinder Ridge for 6 hours/);
    // The saved name in the hint, and an end button whose value the button handler takes.
    expect(text(notice)).toContain('`unmute hdw-above Cinder Ridge`');
    expect(text(notice)).not.toMatch(/does not watch/);
    expect(notice.actions).toEqual([{ actionId: 'end-mute', label: 'End this mute', value: 'hdw-above|43.62,-115.48' }]);
    expect(await muted('hdw-above', '43.6200,-115.4800', NOW_MS + 5 * 3_600_000)).toBe(true);
    expect(await muted('hdw-above', '43.6200,-115.4800', NOW_MS + 7 * 3_600_000)).toBe(false);
    expect(await muted('mixing-reaches-dry-layer', '43.6200,-115.4800')).toBe(false);

    // A point the channel does not watch: muted all the same, and the notice says it is not watched.
    const elsewhere = await router.handleCommand(request('mute plume-cloud-possible 44.3,-116.9', { channelId }));
    expect(text(elsewhere)).toContain('This channel does not watch 44.30°N 116.90°W; the mute holds if it starts to.');
    expect(text(elsewhere)).toContain('`unmute plume-cloud-possible 44.3,-116.9`');
    expect(await muted('plume-cloud-possible', '44.3000,-116.9000')).toBe(true);

    // A demo place (the source's own name, not saved here) is named as such where mutes are listed.
    await router.handleCommand(request('mute hdw-above Sawback Lookout', { channelId }));
    const rules = text(await router.handleCommand(request('rules', { channelId })));
    expect(rules).toContain('`hdw-above` at Sawback Lookout until');
    expect(rules).toContain('`hdw-above` at Cinder Ridge until');
    expect(rules).toContain('`plume-cloud-possible` at 44.30°N 116.90°W until');

    const ended = await router.handleAction({ platform: 'terminal', teamId: '', channelId, userId: 'fbann', actionId: 'end-mute', value: notice.actions[0]!.value, canManageChannel: true });
    expect(ended.title).toMatch(/alerts again at/);
    expect(await muted('hdw-above', '43.6200,-115.4800')).toBe(false);
    expect(faults).toEqual([]);
  });

  it("ends a mute from the notice's button, only for members who may change the channel", async () => {
    const channelId = 'end-mute-ops';
    const press = (actionId: 'mute-rule' | 'end-mute', value: string, canManageChannel = true) =>
      router.handleAction({ platform: 'terminal', teamId: '', channelId, userId: 'fbann', actionId, value, canManageChannel });
    const notice = await press('mute-rule', 'hdw-above|44.3,-116.9');
    const channel = (await store.channels.findChannel({ platform: 'terminal', teamId: '', channelId }))!;
    const muted = () => store.rules.isMuted(channel.id, 'hdw-above', '44.3000,-116.9000', NOW_MS);
    expect(await muted()).toBe(true);
    const button = notice.actions[0]!;
    expect((await press('end-mute', button.value, false)).title).toBe(NEEDS_MANAGE_CHANNEL);
    expect((await press('end-mute', 'hdw-above|somewhere')).title).toMatch(/unknown place "somewhere".*Nothing was changed/);
    expect(await muted()).toBe(true);
    const ended = await press('end-mute', button.value);
    expect(ended.title).toMatch(/alerts again at 44\.30°N 116\.90°W/);
    expect(await muted()).toBe(false);
    expect((await press('end-mute', button.value)).title).toMatch(/is not muted at 44\.30°N 116\.90°W/);
    expect(faults).toEqual([]);
  });

  it('shows the detail of a named hour', async () => {
    const detail = await router.handleCommand(request('detail Kestrel Bench ICP 15'));
    expect(detail.kind).toBe('detail');
    expect(text(detail)).toMatch(/15:00|3 PM|15 h/);
  });

  it('reports a source with no data as an error, never as an all-clear', async () => {
    const empty = mkdtempSync(join(tmpdir(), 'lapsewatch-empty-'));
    const noData = createCommandRouter({ ...dependencies, source: new FileSource({ directory: empty }) });
    const message = await noData.handleCommand(request('44.8N 115.4W'));
    expect(message.kind).toBe('error');
    expect(message.title).toMatch(/No forecast for 44.80°N 115.40°W/);
    rmSync(empty, { recursive: true, force: true });
  });

  it('runs every example that help shows, in a channel of its own, without an error', async () => {
    for (const [verb, { example }] of Object.entries(COMMAND_EXAMPLES)) {
      const prepared = verb === 'forget' || verb === 'unwatch' || verb === 'detail' || verb === 'watch' || verb === 'mute' || verb === 'unmute' ? [`save Cinder Ridge 43.62,-115.48`] : [];
      const channelId = `examples-${verb}`;
      for (const text of prepared) await router.handleCommand(request(text, { channelId }));
      if (verb === 'unwatch') await router.handleCommand(request('watch Cinder Ridge', { channelId }));
      const message = await router.handleCommand(request(example, { channelId }));
      expect(message.kind, `${verb}: ${message.title}`).not.toBe('error');
    }
  });
});

