import { expect, it } from 'vitest';
import { ALL_LOCATIONS } from '../../src/store/storeTypes.ts';
import { describeEachBackend } from './storeTestBackends.ts';

const target = { platform: 'terminal' as const, teamId: '', channelId: 'console' };
const here = '44.0500,-121.3100';
const there = '45.0000,-120.0000';

describeEachBackend('rule overrides and mutes', (h) => {
  it('sets, replaces, lists and clears a channel threshold', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, { unitSystem: 'metric', summaryLocalTime: null }, 1);
    await store.rules.setOverride(channel.id, 'hdw-high', 250, null, 1_000);
    const replaced = await store.rules.setOverride(channel.id, 'hdw-high', 300, 25, 2_000);
    expect(replaced).toEqual({ channelRef: channel.id, ruleId: 'hdw-high', thresholdValue: 300, hysteresisValue: 25, updatedAtMs: 2_000 });
    await store.rules.setOverride(channel.id, 'c-haines-high', 9, null, 2_000);
    expect((await store.rules.listOverrides(channel.id)).map((o) => [o.ruleId, o.thresholdValue])).toEqual([
      ['c-haines-high', 9],
      ['hdw-high', 300],
    ]);
    await expect(store.rules.setOverride(channel.id, 'hdw-high', Number.POSITIVE_INFINITY, null, 3_000)).rejects.toThrow(/threshold/);
    await expect(store.rules.setOverride(channel.id, 'hdw-high', 1, -2, 3_000)).rejects.toThrow(/hysteresis/);
    expect((await store.rules.listOverrides(channel.id)).find((o) => o.ruleId === 'hdw-high')?.thresholdValue).toBe(300);
    expect(await store.rules.clearOverride(channel.id, 'hdw-high')).toBe(true);
    expect(await store.rules.clearOverride(channel.id, 'hdw-high')).toBe(false);
  });

  it('mutes a rule at one place until a time, or everywhere', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, { unitSystem: 'metric', summaryLocalTime: null }, 1);
    await store.rules.setMute(channel.id, 'coupling', here, 10_000, 1_000);
    expect(await store.rules.isMuted(channel.id, 'coupling', here, 9_999)).toBe(true);
    expect(await store.rules.isMuted(channel.id, 'coupling', here, 10_000)).toBe(false);
    expect(await store.rules.isMuted(channel.id, 'coupling', there, 5_000)).toBe(false);
    expect(await store.rules.isMuted(channel.id, 'hdw-high', here, 5_000)).toBe(false);

    await store.rules.setMute(channel.id, 'hdw-high', ALL_LOCATIONS, 20_000, 1_000);
    expect(await store.rules.isMuted(channel.id, 'hdw-high', there, 5_000)).toBe(true);
    expect((await store.rules.listActiveMutes(channel.id, 5_000)).map((m) => m.ruleId)).toEqual(['coupling', 'hdw-high']);
    expect((await store.rules.listActiveMutes(channel.id, 15_000)).map((m) => m.ruleId)).toEqual(['hdw-high']);
    // Ended mutes stay listed for the alert check that follows (it tells what they held back).
    expect((await store.rules.listMutesEndingAfter(channel.id, 9_000)).map((m) => [m.ruleId, m.untilMs])).toEqual([['coupling', 10_000], ['hdw-high', 20_000]]);
    expect((await store.rules.listMutesEndingAfter(channel.id, 10_000)).map((m) => m.ruleId)).toEqual(['hdw-high']);
    await expect(store.rules.listMutesEndingAfter(channel.id, -1)).rejects.toThrow(/afterMs/);

    // A second mute of the same rule and place replaces the first.
    await store.rules.setMute(channel.id, 'coupling', here, 50_000, 2_000);
    expect(await store.rules.isMuted(channel.id, 'coupling', here, 40_000)).toBe(true);
    await expect(store.rules.setMute(channel.id, '', here, 1, 1)).rejects.toThrow(/rule id/);
  });

  it('ends a mute early at one place or everywhere, and keeps it listed as ended', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, { unitSystem: 'metric', summaryLocalTime: null }, 1);
    const other = await store.channels.ensureChannel({ ...target, channelId: 'other' }, { unitSystem: 'metric', summaryLocalTime: null }, 1);
    await store.rules.setMute(channel.id, 'coupling', here, 50_000, 1_000);
    await store.rules.setMute(channel.id, 'coupling', there, 50_000, 1_000);
    await store.rules.setMute(channel.id, 'hdw-high', here, 50_000, 1_000);
    await store.rules.setMute(other.id, 'coupling', here, 50_000, 1_000);

    const atHere = await store.rules.endMutes(channel.id, 'coupling', here, 20_000);
    expect(atHere.map((m) => [m.ruleId, m.locationKey, m.untilMs])).toEqual([['coupling', here, 20_000]]);
    expect(await store.rules.isMuted(channel.id, 'coupling', here, 20_000)).toBe(false);
    // The same rule elsewhere, another rule here and another channel's mute are untouched.
    expect(await store.rules.isMuted(channel.id, 'coupling', there, 20_000)).toBe(true);
    expect(await store.rules.isMuted(channel.id, 'hdw-high', here, 20_000)).toBe(true);
    expect(await store.rules.isMuted(other.id, 'coupling', here, 20_000)).toBe(true);
    // Ended, so the next alert check (which reads mutes ending after its last look) sees it.
    expect((await store.rules.listMutesEndingAfter(channel.id, 10_000)).map((m) => [m.ruleId, m.locationKey, m.untilMs])).toContainEqual(['coupling', here, 20_000]);
    // Ending it again ends nothing: it is no longer in force.
    expect(await store.rules.endMutes(channel.id, 'coupling', here, 21_000)).toEqual([]);

    await store.rules.setMute(channel.id, 'coupling', ALL_LOCATIONS, 60_000, 22_000);
    const everywhere = await store.rules.endMutes(channel.id, 'coupling', null, 30_000);
    expect(everywhere.map((m) => m.locationKey)).toEqual([ALL_LOCATIONS, there]);
    expect(await store.rules.isMuted(channel.id, 'coupling', there, 30_000)).toBe(false);
    expect(await store.rules.isMuted(channel.id, 'hdw-high', here, 30_000)).toBe(true);
    await expect(store.rules.endMutes(channel.id, 'coupling', '', 30_000)).rejects.toThrow(/location key/);
  });
});
