import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import { DEMO_PLACES } from '../../src/forecast/demoPlaces.ts';
import type { ForecastResult } from '../../src/forecast/forecastSource.ts';
import { OpenMeteoSource } from '../../src/forecast/openMeteoSource.ts';
import type { OpenMeteoConfigInput } from '../../src/forecast/openMeteoConfig.ts';
import { OpenMeteoStandIn, type StandInFault } from './openMeteoStandIn.ts';

// Every fault must give a clear message naming the place and the cause, and never a series that
// could be read as "all clear". Places and data are invented (demo scenario on 127.0.0.1).
const [bench] = DEMO_PLACES;
const LOCATION = { latitude: bench.latitude, longitude: bench.longitude, name: bench.name };
const WINDOW = { startTime: '2026-08-14T06:00:00Z', hours: 24 };
const PLACE_IN_MESSAGE = '43.620, -115.480 (Kestrel Bench ICP)';

let standIn: OpenMeteoStandIn;
beforeAll(async () => {
  standIn = await OpenMeteoStandIn.start();
});
afterAll(async () => {
  await standIn.close();
});
afterEach(() => {
  standIn.faultQueue.length = 0;
  standIn.persistentFaults = [];
});

function source(overrides: OpenMeteoConfigInput = {}): OpenMeteoSource {
  return new OpenMeteoSource({ baseUrl: standIn.baseUrl, timeoutMs: 1500, maxAttempts: 3, backoffBaseMs: 20, backoffMaxMs: 80, maxRetryAfterMs: 3000, ...overrides });
}

async function fetchWith(faults: StandInFault[][], overrides: OpenMeteoConfigInput = {}): Promise<{ result: ForecastResult; requests: number }> {
  const before = standIn.forecastRequests;
  standIn.faultQueue.push(...faults);
  const result = await source(overrides).fetchSeries(LOCATION, WINDOW);
  return { result, requests: standIn.forecastRequests - before };
}

function expectFailure(result: ForecastResult, kind: string, ...causes: RegExp[]): void {
  expect(result.ok).toBe(false);
  if (result.ok) return;
  expect('series' in result).toBe(false);
  expect(result.error.kind).toBe(kind);
  expect(result.error.message).toContain(PLACE_IN_MESSAGE);
  expect(result.error.location).toEqual(LOCATION);
  for (const cause of causes) expect(result.error.message).toMatch(cause);
}

describe('transport faults', () => {
  it('a slow answer beyond the timeout is retried, then reported as a timeout', async () => {
    standIn.persistentFaults = [{ kind: 'delay', ms: 1000 }];
    const slow = await fetchWith([], { timeoutMs: 150, maxAttempts: 2 });
    expectFailure(slow.result, 'timeout', /no complete answer within 150 ms/, /gave up after 2 attempts/);
    expect(slow.requests).toBe(2);
  });

  it('a 500 is retried and the second answer used', async () => {
    const { result, requests } = await fetchWith([[{ kind: 'status', status: 500 }]]);
    expect(result.ok).toBe(true);
    expect(requests).toBe(2);
    if (result.ok) expect(result.series.profiles).toHaveLength(24);
  });

  it('5xx on every attempt is a server error after the configured attempts', async () => {
    standIn.persistentFaults = [{ kind: 'status', status: 503 }];
    const { result, requests } = await fetchWith([]);
    expectFailure(result, 'server', /503/, /gave up after 3 attempts/);
    expect(requests).toBe(3);
  });

  it('a 429 waits for Retry-After, then succeeds', async () => {
    const before = standIn.forecastArrivalsMs.length;
    const { result, requests } = await fetchWith([[{ kind: 'status', status: 429, retryAfter: '1' }]], { backoffBaseMs: 0, backoffMaxMs: 0 });
    expect(result.ok).toBe(true);
    expect(requests).toBe(2);
    // With no backoff configured, only honouring the Retry-After of 1 s can put 1 s between the two
    // requests (a lower bound: waiting can never be shorter than asked, however slow the machine).
    const [first, second] = standIn.forecastArrivalsMs.slice(before);
    expect(second - first).toBeGreaterThanOrEqual(990);
  });

  it('a 429 asking to wait longer than allowed is reported with the wait, not waited', async () => {
    const { result, requests } = await fetchWith([[{ kind: 'status', status: 429, retryAfter: '120' }]]);
    expectFailure(result, 'rate-limited', /429/, /wait 120 s/);
    expect(requests).toBe(1);
  });

  it('a 400 is not retried and its reason is passed on', async () => {
    const body = JSON.stringify({ error: true, reason: 'Cannot initialize WeatherVariable from invalid String value temperature_2mm' });
    const { result, requests } = await fetchWith([[{ kind: 'status', status: 400, body }]]);
    expectFailure(result, 'client', /400/, /temperature_2mm/, /not retried/);
    expect(requests).toBe(1);
  });

  it('a refused connection is a network error', async () => {
    const closed = createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const port = (closed.address() as AddressInfo).port;
    await new Promise<void>((resolve) => closed.close(() => resolve()));
    const result = await new OpenMeteoSource({ baseUrl: `http://127.0.0.1:${port}`, maxAttempts: 2, backoffBaseMs: 10, backoffMaxMs: 10, timeoutMs: 1000 }).fetchSeries(LOCATION, WINDOW);
    expectFailure(result, 'network', /connection failed/, /ECONNREFUSED/);
  });
});

describe('faults in the answer', () => {
  it('truncated JSON is a bad response, not a partial series', async () => {
    const { result } = await fetchWith([[{ kind: 'truncate' }]]);
    expectFailure(result, 'bad-response', /not complete JSON/);
  });

  it('one missing upper level is dropped with a note; the rest is kept', async () => {
    const { result } = await fetchWith([[{ kind: 'dropFields', match: /_300hPa$/ }]]);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.series.notes?.join(' ')).toMatch(/300 hPa level dropped because the answer lacks the fields temperature_300hPa.*\(24 of 24 hours\)/);
    for (const profile of result.series.profiles) {
      expect(profile.levels.map((level) => level.pressureHpa)).toEqual([1000, 975, 950, 925, 900, 850, 800, 700, 600, 500, 400, 250, 200]);
    }
  });

  it('a missing level at or below 500 hPa is refused', async () => {
    const { result } = await fetchWith([[{ kind: 'dropFields', match: /_700hPa$/ }]]);
    expectFailure(result, 'bad-response', /700 hPa level is unusable/, /lacks the fields temperature_700hPa/, /never dropped/);
  });

  it('two missing upper levels are refused', async () => {
    const { result } = await fetchWith([[{ kind: 'dropFields', match: /_(300|250)hPa$/ }]]);
    expectFailure(result, 'bad-response', /250 hPa level is unusable/, /at most 1 upper level/);
  });

  it('a null in a surface field is refused, naming the field and the hour', async () => {
    const { result } = await fetchWith([[{ kind: 'nullValues', field: 'temperature_2m', hourIndexes: [5] }]]);
    expectFailure(result, 'bad-profile', /temperature_2m/, /2026-08-14T11:00:00Z/, /null/);
  });

  it('a null in a low level is refused; a null in an upper level drops that level for that hour', async () => {
    const low = await fetchWith([[{ kind: 'nullValues', field: 'dew_point_700hPa', hourIndexes: [3] }]]);
    expectFailure(low.result, 'bad-profile', /dew_point_700hPa has no value \(null\)/, /2026-08-14T09:00:00Z/);

    const upper = await fetchWith([[{ kind: 'nullValues', field: 'wind_speed_250hPa', hourIndexes: [2, 3] }]]);
    expect(upper.result.ok).toBe(true);
    if (!upper.result.ok) return;
    expect(upper.result.series.notes?.join(' ')).toMatch(/250 hPa level dropped because wind_speed_250hPa has no value \(null\) \(2 of 24 hours\)/);
    expect(upper.result.series.profiles[2].levels.some((level) => level.pressureHpa === 250)).toBe(false);
    expect(upper.result.series.profiles[4].levels.some((level) => level.pressureHpa === 250)).toBe(true);
  });

  it('a level under the ground with nulls is dropped (it is not air); the profile stays usable', async () => {
    const { result } = await fetchWith([[{ kind: 'nullValues', field: 'temperature_1000hPa' }]]);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.series.notes?.join(' ')).toMatch(/1000 hPa level dropped, it lies under the ground/);
    for (const profile of result.series.profiles) {
      expect(profile.levels[0].pressureHpa).toBe(975);
      expect(prepareProfile(profile).ok).toBe(true);
    }
  });

  it('a level under the ground with values is kept for the core to drop', async () => {
    const { result } = await fetchWith([]);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const profile = result.series.profiles[10];
    expect(profile.levels[0].pressureHpa).toBe(1000);
    expect(profile.levels[0].pressureHpa).toBeGreaterThan(profile.surface.pressureHpa);
    expect(profile.levels[0].heightM).toBeLessThan(profile.surface.elevationM);
  });

  it('a renamed level field is refused, saying it may have been renamed', async () => {
    const { result } = await fetchWith([[{ kind: 'renameFields', from: 'geopotential_height', to: 'geopotential' }]]);
    expectFailure(result, 'bad-response', /lacks geopotential_height_1000hPa and the same quantity at every other level/, /may have renamed them/, /geopotential_1000hPa/);
  });

  it('a renamed surface field is refused', async () => {
    const { result } = await fetchWith([[{ kind: 'renameFields', from: 'temperature_2m', to: 'temperature_2m_agl' }]]);
    expectFailure(result, 'bad-response', /lacks the surface field temperature_2m/, /temperature_2m_agl/);
  });

  it('a value outside physical bounds is refused', async () => {
    const { result } = await fetchWith([[{ kind: 'setValue', field: 'temperature_850hPa', hourIndex: 7, value: 999 }]]);
    expectFailure(result, 'bad-response', /temperature_850hPa is 999/, /2026-08-14T13:00:00Z/);
  });

  it('heights that do not rise with falling pressure are refused', async () => {
    const { result } = await fetchWith([[{ kind: 'setValue', field: 'geopotential_height_500hPa', hourIndex: 1, value: 100 }]]);
    expectFailure(result, 'bad-response', /500 hPa level \(100 m\) is not above/);
  });
});
