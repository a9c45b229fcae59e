// One alert-check cycle end to end: the invented demo forecast, the real assessment, crossings and
// alert messages, a real SQLite store. Two replicas tick at the same instant.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createAlertCheckCycle, realAlertCheckDeps, type AlertCheckDeps } from '../../src/schedule/alertCheckCycle.ts';
import { channelRuleSet } from '../../src/schedule/ruleSet.ts';
import { DEFAULT_ALERT_CHECK_INTERVAL_MS } from '../../src/schedule/alertCheckDue.ts';
import { payloadToMessage } from '../../src/delivery/outboxPayload.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { locationKeyOf } from '../../src/store/storeKeys.ts';
import type { Message } from '../../src/render/message.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { capturingLogger, openTempSqliteStore, slackTarget, discordTarget } from '../delivery/deliveryFixtures.ts';
import { ALDER_SINK, KESTREL_BENCH, channelWatching, countingDemoSource, shippedRules } from './scheduleFixtures.ts';

// 08:00 MDT on an invented July morning: the demo's first afternoon is ahead.
const MORNING = Date.UTC(2031, 6, 14, 14, 0, 0);

const HEADLINE_NAME = 'Mixed layer reaches a dry layer aloft';

function messageOf(row: { payload: unknown }): Message {
  const decoded = payloadToMessage(row.payload);
  if (!decoded.ok) throw new Error('an outbox payload did not decode');
  return decoded.message;
}

/** The real check chain (assessment, crossings, messages) over `fetchSeries`, as one worker. */
function realCycle(store: Store, fetchSeries: AlertCheckDeps['fetchSeries']) {
  return createAlertCheckCycle({ store, deps: realAlertCheckDeps({ fetchSeries, defaultRules: shippedRules() }), workerId: 'w', logger: capturingLogger().logger });
}

async function allOutbox(store: Store): Promise<Array<{ dedupeKey: string; target: string; payload: unknown }>> {
  const rows = await store.outbox.claimDueOutbox('inspector', 10_000, 1, MORNING + 10 * 86_400_000);
  return rows.map((r) => ({ dedupeKey: r.dedupeKey, target: `${r.target.platform}:${r.target.channelId}`, payload: r.payload }));
}

describe('alert-check cycle', () => {
  let store: Store;
  beforeEach(async () => {
    ({ store } = await openTempSqliteStore('alertcycle'));
  });
  afterEach(async () => {
    await store.close();
  });

  it('fetches each place once however many channels watch it, and tells each new watch once, in one message', async () => {
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    const b = await channelWatching(store, slackTarget('C0BBB'), [KESTREL_BENCH], MORNING);
    await channelWatching(store, discordTarget('1300000000000000001'), [KESTREL_BENCH, ALDER_SINK], MORNING);
    // Channel B mutes the headline rule at Kestrel Bench.
    const kestrelKey = locationKeyOf(KESTREL_BENCH.latitudeDeg, KESTREL_BENCH.longitudeDeg);
    await store.rules.setMute(b.id, 'mixing-reaches-dry-layer', kestrelKey, MORNING + 6 * 3600_000, MORNING);

    const source = countingDemoSource();
    const deps = realAlertCheckDeps({ fetchSeries: source.fetchSeries, defaultRules: shippedRules() });
    const replicas = ['replica-1', 'replica-2'].map((workerId) => createAlertCheckCycle({ store, deps, workerId, logger: capturingLogger().logger }));
    const [r1, r2] = await Promise.all(replicas.map((cycle) => cycle.run(MORNING)));

    expect(source.requests()).toBe(2); // two places, two replicas, four watches: two requests
    expect(r1!.placesChecked + r2!.placesChecked).toBe(2);
    expect(r1!.crossingsRecorded + r2!.crossingsRecorded).toBeGreaterThan(4);
    const rows = await allOutbox(store);
    // Every watch is new: one digest each (the Discord channel watches two places), nothing else.
    expect(rows.map((row) => row.target).sort()).toEqual(['discord:1300000000000000001', 'discord:1300000000000000001', 'slack:C0AAA', 'slack:C0BBB']);
    expect(new Set(rows.map((row) => row.dedupeKey)).size).toBe(rows.length);
    for (const row of rows) {
      expect(row.dedupeKey.startsWith('alert-digest|')).toBe(true);
      const message = messageOf(row);
      expect(message.footer.startsWith(SAFETY_FOOTER)).toBe(true);
      expect(message.title).toMatch(/: \d+ alerts stand in the forecast$/);
    }
    const kestrel = (target: string) => messageOf(rows.find((row) => row.target === target && row.dedupeKey.includes(kestrelKey))!);
    // Same forecast, same units: A and the Discord channel read the same lines; B's lack the muted rule.
    expect(kestrel('slack:C0AAA').sections[0]!.lines).toEqual(kestrel('discord:1300000000000000001').sections[0]!.lines);
    expect(kestrel('slack:C0AAA').sections[0]!.lines.join('\n')).toContain(HEADLINE_NAME);
    expect(kestrel('slack:C0BBB').sections[0]!.lines.join('\n')).not.toContain(HEADLINE_NAME);
  });

  it('queues the alerts of a place in forecast order, and never pushes the end of a rule', async () => {
    // A watch checked before gets each new crossing as an alert of its own; a new one, the digest.
    await channelWatching(store, slackTarget('C0ORD'), [KESTREL_BENCH], MORNING);
    const kestrelKey = locationKeyOf(KESTREL_BENCH.latitudeDeg, KESTREL_BENCH.longitudeDeg);
    await store.watches.markAlertChecked(kestrelKey, MORNING - 3600_000);
    await channelWatching(store, slackTarget('C0NEW'), [KESTREL_BENCH], MORNING);
    const source = countingDemoSource();
    const cycle = realCycle(store, source.fetchSeries);
    const report = await cycle.run(MORNING);
    const rows = await store.outbox.claimDueOutbox('inspector', 10_000, 1, MORNING + 10 * 86_400_000);
    const ordered = rows.filter((row) => row.target.channelId === 'C0ORD');
    expect(ordered.length).toBeGreaterThan(2);
    expect(rows.some((row) => row.dedupeKey.includes('|down|'))).toBe(false);
    expect(report.endsNotAnnounced).toBeGreaterThan(0);
    // Claimed oldest-due first: that must be the order of the forecast hours the alerts are about.
    const validTimes = ordered.map((row) => (payloadToMessage(row.payload) as { ok: true; message: { title: string } }).message.title);
    const crossingTimes = await Promise.all(ordered.map(async (row) => {
      const [locationKey, ruleId, validLocalDay] = row.dedupeKey.split('|').slice(1, 4);
      return (await store.alerts.findCrossing({ locationKey: locationKey!, ruleId: ruleId!, validLocalDay: validLocalDay!, direction: 'up' }))!.validTime;
    }));
    const sorted = [...crossingTimes].sort((a, b) => Date.parse(a) - Date.parse(b));
    expect(crossingTimes, validTimes.join('\n')).toEqual(sorted);
    // The digest lists the same alerts in the same order (as many as it shows).
    const digest = messageOf({ payload: rows.find((row) => row.target.channelId === 'C0NEW')!.payload });
    const digestRules = digest.sections[0]!.lines.filter((line) => line.includes(' · ')).map((line) => line.split(' · ')[1]!.split(':')[0]);
    const alertRules = validTimes.map((title) => title.split(':')[0]);
    expect(digestRules).toEqual(alertRules.slice(0, digestRules.length));
    expect(digest.title).toBe(`Kestrel Bench ICP: ${ordered.length} alerts stand in the forecast`);
  });

  it.each([
    ['in the same interval', 60_000],
    // The check's job has a new name in the next interval; the digest's key does not.
    ['in a later interval (the process was down across it)', DEFAULT_ALERT_CHECK_INTERVAL_MS + 60_000],
  ])('a first check that fails after queuing its digest, run again %s, queues no second digest', async (_when, rerunAfterMs) => {
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    const source = countingDemoSource();
    // The real store, but the first "mark checked" fails, as if the process died at that point.
    let failures = 1;
    const watches = Object.create(store.watches) as Store['watches'];
    watches.markAlertChecked = async (...args) => {
      if (failures-- > 0) throw new Error('injected: the store went away');
      return store.watches.markAlertChecked(...args);
    };
    const cycle = realCycle({ ...store, watches }, source.fetchSeries);
    const failed = await cycle.run(MORNING);
    expect(failed.errors).toBe(1);
    expect(failed.digestsQueued).toBe(1);
    const again = await cycle.run(MORNING + rerunAfterMs);
    expect(again.placesChecked).toBe(1);
    expect(again.digestsQueued).toBe(0);
    expect(await allOutbox(store)).toHaveLength(1);
    expect((await cycle.run(MORNING + rerunAfterMs + 60_000)).placesDue).toBe(0);
  });

  it('a watch switched off and on again is not told the same digest twice', async () => {
    const target = slackTarget('C0AAA');
    await channelWatching(store, target, [KESTREL_BENCH], MORNING);
    const source = countingDemoSource();
    const cycle = realCycle(store, source.fetchSeries);
    expect((await cycle.run(MORNING)).digestsQueued).toBe(1);
    const channel = (await store.channels.findChannel(target))!;
    const [watch] = await store.watches.listWatches(channel.id);
    await store.watches.deactivateWatch(channel.id, watch!.locationKey);
    await store.watches.addWatch(channel.id, { latitudeDeg: watch!.latitudeDeg, longitudeDeg: watch!.longitudeDeg, placeName: watch!.placeName, createdBy: 'U0CREWLEAD' }, MORNING + 5 * 60_000);
    // Checked again at the latest one interval later (alertCheckDue.ts). Same forecast, same
    // warnings: the channel was told them already.
    const rewatched = await cycle.run(MORNING + DEFAULT_ALERT_CHECK_INTERVAL_MS + 6 * 60_000);
    expect(rewatched.placesChecked).toBe(1);
    expect(rewatched.digestsQueued).toBe(0);
    expect((await allOutbox(store)).filter((row) => row.dedupeKey.startsWith('alert-digest|'))).toHaveLength(1);
  });

  it('checks again only after the interval, and an unchanged forecast queues nothing new', async () => {
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    const source = countingDemoSource();
    const cycle = realCycle(store, source.fetchSeries);
    const first = await cycle.run(MORNING);
    expect(first.crossingsRecorded).toBeGreaterThan(0);
    expect((await cycle.run(MORNING + 10 * 60_000)).placesDue).toBe(0);
    expect(source.requests()).toBe(1);
    const again = await cycle.run(MORNING + 30 * 60_000);
    expect(again.placesChecked).toBe(1);
    expect(again.crossingsRecorded).toBe(0);
    expect(again.messagesQueued).toBe(0);
  });

  it('a channel that starts watching a place others watch is checked at the next tick, and told what stands', async () => {
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    const source = countingDemoSource();
    const cycle = realCycle(store, source.fetchSeries);
    const first = await cycle.run(MORNING);
    expect(first.crossingsRecorded).toBeGreaterThan(0);
    const toA = await allOutbox(store);
    expect(toA).toHaveLength(1);

    // B joins after the place was checked: its watch is new, the place's crossings are not.
    await channelWatching(store, slackTarget('C0BBB'), [KESTREL_BENCH], MORNING + 60_000);
    const joined = await cycle.run(MORNING + 2 * 60_000);
    expect(joined.placesChecked).toBe(1);
    expect(joined.crossingsRecorded).toBe(0);
    // (allOutbox claims what it reads: these are the rows queued since.)
    const queuedSince = await allOutbox(store);
    // The same alerts, in one message, to B only: A hears nothing twice.
    expect(queuedSince.map((row) => row.target)).toEqual(['slack:C0BBB']);
    expect(messageOf(queuedSince[0]!).sections[0]!.lines).toEqual(messageOf(toA[0]!).sections[0]!.lines);

    // Checked: not due again before the interval, due after it, and nothing is repeated.
    expect((await cycle.run(MORNING + 10 * 60_000)).placesDue).toBe(0);
    const later = await cycle.run(MORNING + 40 * 60_000);
    expect(later.placesChecked).toBe(1);
    expect(later.messagesQueued).toBe(0);
    expect(source.requests()).toBe(3);
  });

  it('a channel whose mute ends is told the muted rule\'s alerts that stand, once', async () => {
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    const b = await channelWatching(store, slackTarget('C0BBB'), [KESTREL_BENCH], MORNING);
    const kestrelKey = locationKeyOf(KESTREL_BENCH.latitudeDeg, KESTREL_BENCH.longitudeDeg);
    await store.rules.setMute(b.id, 'mixing-reaches-dry-layer', kestrelKey, MORNING + 6 * 3600_000, MORNING);
    const source = countingDemoSource();
    const cycle = realCycle(store, source.fetchSeries);
    const headline = (rows: Array<{ dedupeKey: string; target: string }>, target: string) =>
      rows.filter((row) => row.target === target && row.dedupeKey.includes('|mixing-reaches-dry-layer|')).map((row) => row.dedupeKey.split('|').slice(1, 5).join('|'));

    await cycle.run(MORNING);
    const first = await allOutbox(store);
    expect(messageOf(first.find((row) => row.target === 'slack:C0AAA')!).sections[0]!.lines.join('\n')).toContain(HEADLINE_NAME);
    expect(messageOf(first.find((row) => row.target === 'slack:C0BBB')!).sections[0]!.lines.join('\n')).not.toContain(HEADLINE_NAME);
    // Still muted at the next check: nothing.
    await cycle.run(MORNING + 40 * 60_000);
    expect(headline(await allOutbox(store), 'slack:C0BBB')).toEqual([]);

    // The first check after the mute ends: B hears the headline crossings that are still ahead,
    // each announced to A at the first check.
    const after = await cycle.run(MORNING + 6 * 3600_000 + 30 * 60_000);
    expect(after.toldStanding).toBeGreaterThan(0);
    const queued = await allOutbox(store);
    const toB = headline(queued, 'slack:C0BBB');
    expect(toB.length).toBeGreaterThan(0);
    for (const key of toB) {
      const [locationKey, ruleId, validLocalDay, direction] = key.split('|');
      const record = await store.alerts.findCrossing({ locationKey: locationKey!, ruleId: ruleId!, validLocalDay: validLocalDay!, direction: direction as 'up' });
      // (Each alert of a check is queued a millisecond after the one before.)
      expect(record!.firstAnnouncedAtMs - MORNING).toBeGreaterThanOrEqual(0);
      expect(record!.firstAnnouncedAtMs - MORNING).toBeLessThan(1_000);
    }
    // A heard them already; and the next check tells B nothing twice (a crossing newly inside the
    // 48 hours may come, to both).
    expect(headline(queued, 'slack:C0AAA').filter((key) => toB.includes(key))).toEqual([]);
    await cycle.run(MORNING + 7 * 3600_000 + 10 * 60_000);
    expect(headline(await allOutbox(store), 'slack:C0BBB').filter((key) => toB.includes(key))).toEqual([]);
  });

  it('a mute ended early (the unmute command) is told at the next check like one that ran out', async () => {
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    const b = await channelWatching(store, slackTarget('C0BBB'), [KESTREL_BENCH], MORNING);
    const kestrelKey = locationKeyOf(KESTREL_BENCH.latitudeDeg, KESTREL_BENCH.longitudeDeg);
    await store.rules.setMute(b.id, 'mixing-reaches-dry-layer', kestrelKey, MORNING + 6 * 3600_000, MORNING);
    const cycle = realCycle(store, countingDemoSource().fetchSeries);
    const headlineToB = async (): Promise<Array<{ dedupeKey: string }>> => (await allOutbox(store)).filter((row) => row.target === 'slack:C0BBB' && row.dedupeKey.includes('|mixing-reaches-dry-layer|'));

    await cycle.run(MORNING);
    await cycle.run(MORNING + 40 * 60_000);
    expect(await headlineToB()).toEqual([]);
    // Ended an hour in, five hours early: the next check tells B what the mute held back.
    expect((await store.rules.endMutes(b.id, 'mixing-reaches-dry-layer', kestrelKey, MORNING + 60 * 60_000)).length).toBe(1);
    const after = await cycle.run(MORNING + 80 * 60_000);
    expect(after.toldStanding).toBeGreaterThan(0);
    const told = (await headlineToB()).map((row) => row.dedupeKey);
    expect(told.length).toBeGreaterThan(0);
    // Told once: the next check queues none of them again (allOutbox claims what it reads).
    await cycle.run(MORNING + 120 * 60_000);
    expect((await headlineToB()).filter((row) => told.includes(row.dedupeKey))).toEqual([]);
  });

  it('a newer model run makes a place due before the interval', async () => {
    await channelWatching(store, slackTarget('C0AAA'), [ALDER_SINK], MORNING);
    const source = countingDemoSource();
    let latest: string | null = null;
    const deps = { ...realAlertCheckDeps({ fetchSeries: source.fetchSeries, defaultRules: shippedRules() }), latestRunTime: async () => latest };
    const cycle = createAlertCheckCycle({ store, deps, workerId: 'w', logger: capturingLogger().logger });
    await cycle.run(MORNING);
    latest = '2031-07-14T12:00:00Z'; // the demo's run for this window
    expect((await cycle.run(MORNING + 5 * 60_000)).placesDue).toBe(0); // not newer than the run used
    latest = '2031-07-15T00:00:00Z';
    const report = await cycle.run(MORNING + 6 * 60_000);
    expect(report.placesDue).toBe(1);
    expect(source.requests()).toBe(2);
  });

  it('a channel override gets its own crossing key; default channels share one', () => {
    const defaults = shippedRules();
    const plain = channelRuleSet(defaults, []);
    const changed = channelRuleSet(defaults, [{ channelRef: 'c', ruleId: 'hdw-above', thresholdValue: 300, hysteresisValue: null, updatedAtMs: 0 }]);
    expect(plain.crossingRuleKey.get('hdw-above')).toBe('hdw-above');
    expect(changed.crossingRuleKey.get('hdw-above')).toMatch(/^hdw-above@300\//);
    expect(changed.signature).not.toBe(plain.signature);
    expect(channelRuleSet(defaults, []).signature).toBe(plain.signature);
  });
});
