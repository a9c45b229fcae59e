import { describe, expect, it } from 'vitest';
import { isStoreError } from '../../src/store/storeError.ts';
import { locationKeyOf } from '../../src/store/storeKeys.ts';
import type { ChannelTarget } from '../../src/store/storeTypes.ts';
import { describeEachBackend } from './storeTestBackends.ts';

// Invented channels and places for tests; none is real.
const target: ChannelTarget = { platform: 'slack', teamId: 'T-INVENTED', channelId: 'C-ember-creek' };
const defaults = { unitSystem: 'metric' as const, summaryLocalTime: null };

describeEachBackend('channels', (h) => {
  it('creates a channel once and returns the same one after', async () => {
    const store = await h.openFresh();
    const first = await store.channels.ensureChannel(target, { unitSystem: 'us', summaryLocalTime: '06:30' }, 1_000);
    const second = await store.channels.ensureChannel(target, defaults, 2_000);
    expect(second.id).toBe(first.id);
    expect(second).toMatchObject({ unitSystem: 'us', summaryLocalTime: '06:30', active: true, createdAtMs: 1_000 });
    expect(await store.channels.findChannel(target)).toEqual(second);
    expect(await store.channels.getChannelById(first.id)).toEqual(second);
    expect(await store.channels.findChannel({ ...target, channelId: 'C-other' })).toBeNull();
  });

  it('changes unit system and summary time, and refuses bad values without changing anything', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, defaults, 1_000);
    expect((await store.channels.setUnitSystem(channel.id, 'us', 2_000)).unitSystem).toBe('us');
    expect((await store.channels.setSummaryLocalTime(channel.id, '05:45', 3_000)).summaryLocalTime).toBe('05:45');
    await expect(store.channels.setSummaryLocalTime(channel.id, '25:00', 4_000)).rejects.toThrow(/HH:MM/);
    await expect(store.channels.setUnitSystem(channel.id, 'imperial' as never, 4_000)).rejects.toSatisfy((e) =>
      isStoreError(e, 'invalid-input'),
    );
    const after = await store.channels.getChannelById(channel.id);
    expect(after).toMatchObject({ unitSystem: 'us', summaryLocalTime: '05:45', updatedAtMs: 3_000 });
    expect((await store.channels.setSummaryLocalTime(channel.id, null, 5_000)).summaryLocalTime).toBeNull();
    await expect(store.channels.setUnitSystem('no-such-channel', 'us', 6_000)).rejects.toThrow(/no channel/);
  });

  it('marks a channel that removed the bot inactive with its watches, keeps them, and lists only active summaries', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, { unitSystem: 'metric', summaryLocalTime: '06:00' }, 1_000);
    const other = await store.channels.ensureChannel({ ...target, channelId: 'C-other' }, { unitSystem: 'us', summaryLocalTime: '07:00' }, 1_000);
    await store.channels.ensureChannel({ ...target, channelId: 'C-quiet' }, defaults, 1_000);
    await store.watches.addWatch(channel.id, { latitudeDeg: 44.1, longitudeDeg: -121.2, createdBy: 'U1' }, 1_000);
    await store.watches.addWatch(channel.id, { latitudeDeg: 44.2, longitudeDeg: -121.3, createdBy: 'U1' }, 1_000);

    expect((await store.channels.listChannelsWithSummary()).map((c) => c.id).sort()).toEqual([channel.id, other.id].sort());
    expect(await store.channels.markChannelInactive(target, 2_000)).toEqual({ found: true, watchesDeactivated: 2 });
    expect(await store.channels.markChannelInactive({ ...target, channelId: 'C-never-seen' }, 2_000)).toEqual({
      found: false,
      watchesDeactivated: 0,
    });
    expect((await store.channels.findChannel(target))?.active).toBe(false);
    expect(await store.watches.listWatches(channel.id)).toEqual([]);
    expect(await store.watches.listWatches(channel.id, { includeInactive: true })).toHaveLength(2);
    expect((await store.channels.listChannelsWithSummary()).map((c) => c.id)).toEqual([other.id]);

    // Invited back: the channel is active again, its old watches stay off until added again.
    const back = await store.channels.ensureChannel(target, defaults, 3_000);
    expect(back).toMatchObject({ id: channel.id, active: true, summaryLocalTime: '06:00' });
    expect(await store.watches.listWatches(channel.id)).toEqual([]);
  });

  it('refuses a bad target', async () => {
    const store = await h.openFresh();
    await expect(store.channels.ensureChannel({ ...target, platform: 'irc' as never }, defaults, 1)).rejects.toThrow(/platform/);
    await expect(store.channels.ensureChannel({ ...target, channelId: '' }, defaults, 1)).rejects.toThrow(/channelId/);
  });
});

describeEachBackend('saved places', (h) => {
  it('saves, finds ignoring case, lists by name and removes', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, defaults, 1_000);
    const saved = await store.places.savePlace(
      channel.id,
      { name: '  Ridge Camp ', latitudeDeg: 44.05, longitudeDeg: -121.31, elevationM: 1250, timeZone: 'America/Los_Angeles' },
      1_000,
    );
    expect(saved.ok).toBe(true);
    await store.places.savePlace(channel.id, { name: 'Alder Flat', latitudeDeg: 44.5, longitudeDeg: -121.9 }, 1_000);
    const found = await store.places.findPlace(channel.id, 'RIDGE   camp');
    expect(found).toMatchObject({ name: 'Ridge Camp', latitudeDeg: 44.05, longitudeDeg: -121.31, elevationM: 1250, timeZone: 'America/Los_Angeles' });
    expect((await store.places.listPlaces(channel.id)).map((p) => p.name)).toEqual(['Alder Flat', 'Ridge Camp']);
    expect(await store.places.removePlace(channel.id, 'ridge camp')).toBe(true);
    expect(await store.places.removePlace(channel.id, 'ridge camp')).toBe(false);
    expect(await store.places.findPlace(channel.id, 'Ridge Camp')).toBeNull();
  });

  it('refuses a name already used in the channel (any case) and keeps the first, but allows it in another channel', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, defaults, 1_000);
    const other = await store.channels.ensureChannel({ ...target, channelId: 'C-other' }, defaults, 1_000);
    await store.places.savePlace(channel.id, { name: 'Ridge Camp', latitudeDeg: 44.05, longitudeDeg: -121.31 }, 1_000);
    const again = await store.places.savePlace(channel.id, { name: 'RIDGE CAMP', latitudeDeg: 10, longitudeDeg: 10 }, 2_000);
    expect(again).toMatchObject({ ok: false, reason: 'name-taken', existing: { name: 'Ridge Camp', latitudeDeg: 44.05 } });
    expect(again.ok === false && again.message).toMatch(/already has a place called "Ridge Camp"/);
    expect((await store.places.savePlace(other.id, { name: 'ridge camp', latitudeDeg: 1, longitudeDeg: 2 }, 2_000)).ok).toBe(true);
    expect(await store.places.listPlaces(channel.id)).toHaveLength(1);
  });

  it('refuses bad coordinates, names and time zones, writing nothing', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, defaults, 1_000);
    await expect(store.places.savePlace(channel.id, { name: 'X', latitudeDeg: 95, longitudeDeg: 0 }, 1)).rejects.toThrow(/latitudeDeg/);
    await expect(store.places.savePlace(channel.id, { name: '   ', latitudeDeg: 5, longitudeDeg: 0 }, 1)).rejects.toThrow(/name/);
    await expect(
      store.places.savePlace(channel.id, { name: 'Y', latitudeDeg: 5, longitudeDeg: 0, timeZone: 'Mars/Olympus' }, 1),
    ).rejects.toThrow(/time zone/);
    expect(await store.places.listPlaces(channel.id)).toEqual([]);
  });
});

describeEachBackend('watches', (h) => {
  it('adds a watch once per point, reactivates it when added again, and lists it with its channel', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(target, { unitSystem: 'us', summaryLocalTime: '06:30' }, 1_000);
    const first = await store.watches.addWatch(
      channel.id,
      { placeName: 'Ridge Camp', latitudeDeg: 44.05, longitudeDeg: -121.31, timeZone: 'America/Los_Angeles', createdBy: 'U-ana' },
      1_000,
    );
    expect(first.created).toBe(true);
    expect(first.watch).toMatchObject({
      locationKey: locationKeyOf(44.05, -121.31),
      placeName: 'Ridge Camp',
      createdBy: 'U-ana',
      createdAtMs: 1_000,
      active: true,
      lastAlertCheckAtMs: null,
      lastSummaryLocalDate: null,
    });
    expect(await store.watches.deactivateWatch(channel.id, first.watch.locationKey)).toBe(true);
    expect(await store.watches.deactivateWatch(channel.id, first.watch.locationKey)).toBe(false);
    // Nearly the same point (within the key's rounding) is the same watch.
    const again = await store.watches.addWatch(channel.id, { latitudeDeg: 44.050001, longitudeDeg: -121.31, createdBy: 'U-bo' }, 2_000);
    expect(again).toMatchObject({ created: false, watch: { id: first.watch.id, active: true, placeName: 'Ridge Camp' } });

    const listed = await store.watches.listActiveWatchesWithChannel();
    expect(listed).toHaveLength(1);
    expect(listed[0]).toMatchObject({ id: first.watch.id, channel: { id: channel.id, unitSystem: 'us', summaryLocalTime: '06:30' } });
  });

  it('records alert checks per point and summary dates per watch', async () => {
    const store = await h.openFresh();
    const a = await store.channels.ensureChannel(target, defaults, 1_000);
    const b = await store.channels.ensureChannel({ ...target, channelId: 'C-b' }, defaults, 1_000);
    const wa = (await store.watches.addWatch(a.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 1_000)).watch;
    const wb = (await store.watches.addWatch(b.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 1_000)).watch;
    const wc = (await store.watches.addWatch(b.id, { latitudeDeg: 41, longitudeDeg: -110, createdBy: 'U' }, 1_000)).watch;
    expect(await store.watches.markAlertChecked(wa.locationKey, 5_000)).toBe(2);
    expect(await store.watches.markSummarySent([wa.id, wc.id], '2031-07-14')).toBe(2);
    await expect(store.watches.markSummarySent([wb.id], '14/07/2031')).rejects.toThrow(/YYYY-MM-DD/);
    const all = [...(await store.watches.listWatches(a.id)), ...(await store.watches.listWatches(b.id))];
    const byId = new Map(all.map((w) => [w.id, w]));
    expect(byId.get(wa.id)).toMatchObject({ lastAlertCheckAtMs: 5_000, lastSummaryLocalDate: '2031-07-14' });
    expect(byId.get(wb.id)).toMatchObject({ lastAlertCheckAtMs: 5_000, lastSummaryLocalDate: null });
    expect(byId.get(wc.id)).toMatchObject({ lastAlertCheckAtMs: null, lastSummaryLocalDate: '2031-07-14' });
  });

  it('marks only the watches a check saw, and a watch switched off and on again counts as new', async () => {
    const store = await h.openFresh();
    const a = await store.channels.ensureChannel(target, defaults, 1_000);
    const b = await store.channels.ensureChannel({ ...target, channelId: 'C-b' }, defaults, 1_000);
    const wa = (await store.watches.addWatch(a.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 1_000)).watch;
    const wb = (await store.watches.addWatch(b.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 1_000)).watch;
    // The check saw A's watch only (B's came in while it ran).
    expect(await store.watches.markAlertChecked(wa.locationKey, 5_000, [wa.id])).toBe(1);
    expect(await store.watches.markAlertChecked(wa.locationKey, 5_000, [])).toBe(0);
    const checkOf = async (channelId: string, watchId: string) => (await store.watches.listWatches(channelId)).find((w) => w.id === watchId)?.lastAlertCheckAtMs;
    expect(await checkOf(a.id, wa.id)).toBe(5_000);
    expect(await checkOf(b.id, wb.id)).toBeNull();
    await expect(store.watches.markAlertChecked(wa.locationKey, 5_000, [''])).rejects.toThrow();

    // Watching again while on keeps the check; after switching off, watching again makes it new.
    await store.watches.addWatch(a.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 6_000);
    expect(await checkOf(a.id, wa.id)).toBe(5_000);
    expect(await store.watches.deactivateWatch(a.id, wa.locationKey)).toBe(true);
    const back = await store.watches.addWatch(a.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 7_000);
    expect(back).toMatchObject({ created: false, watch: { id: wa.id, active: true, lastAlertCheckAtMs: null } });
  });

  it('leaves watches of inactive channels out of the scheduler list', async () => {
    const store = await h.openFresh();
    const a = await store.channels.ensureChannel(target, defaults, 1_000);
    const b = await store.channels.ensureChannel({ ...target, channelId: 'C-b' }, defaults, 1_000);
    await store.watches.addWatch(a.id, { latitudeDeg: 40, longitudeDeg: -110, createdBy: 'U' }, 1_000);
    const wb = (await store.watches.addWatch(b.id, { latitudeDeg: 41, longitudeDeg: -111, createdBy: 'U' }, 1_000)).watch;
    await store.channels.markChannelInactive(target, 2_000);
    expect((await store.watches.listActiveWatchesWithChannel()).map((w) => w.id)).toEqual([wb.id]);
  });
});

describeEachBackend('writes for an unknown channel', (h) => {
  it('are refused with a message, and write nothing', async () => {
    const store = await h.openFresh();
    const ghost = 'channel-that-does-not-exist';
    await expect(store.places.savePlace(ghost, { name: 'A', latitudeDeg: 1, longitudeDeg: 2 }, 1)).rejects.toThrow(/no channel with id/);
    await expect(store.watches.addWatch(ghost, { latitudeDeg: 1, longitudeDeg: 2, createdBy: 'U' }, 1)).rejects.toThrow(/no channel with id/);
    await expect(store.rules.setOverride(ghost, 'hdw-high', 1, null, 1)).rejects.toThrow(/no channel with id/);
    await expect(store.rules.setMute(ghost, 'hdw-high', '*', 5, 1)).rejects.toThrow(/no channel with id/);
    expect(await store.watches.listActiveWatchesWithChannel()).toEqual([]);
    expect(await store.places.listPlaces(ghost)).toEqual([]);
  });
});

describe('location keys', () => {
  it('round to 1e-4 degree and never differ by the sign of zero', () => {
    expect(locationKeyOf(44.05, -121.31)).toBe('44.0500,-121.3100');
    expect(locationKeyOf(-0.00001, 0.00001)).toBe('0.0000,0.0000');
    expect(locationKeyOf(44.05004, -121.31)).toBe(locationKeyOf(44.05, -121.31));
    expect(locationKeyOf(44.0501, -121.31)).not.toBe(locationKeyOf(44.05, -121.31));
  });
});
