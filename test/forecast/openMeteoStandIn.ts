import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { ProfileInput } from '../../src/core/profile.ts';
import { DemoSource } from '../../src/forecast/demoSource.ts';

/**
 * A local stand-in for Open-Meteo's /v1/forecast and metadata endpoints, on 127.0.0.1, serving
 * answers of the documented shape built from the (invented) demo scenario. It counts requests and
 * can be told to misbehave: per request from a queue, or on every request.
 */
export type StandInFault =
  | { kind: 'delay'; ms: number }
  | { kind: 'status'; status: number; retryAfter?: string; body?: string }
  | { kind: 'truncate' }
  /** Remove every hourly field whose name matches. */
  | { kind: 'dropFields'; match: RegExp }
  /** Put null into a field at the given hours (all hours when absent). */
  | { kind: 'nullValues'; field: string; hourIndexes?: number[] }
  /** Rename hourly fields: every occurrence of `from` in a field name becomes `to`. */
  | { kind: 'renameFields'; from: string; to: string }
  /** Serve winds in km/h whatever the request asked (and say so in hourly_units). */
  | { kind: 'windsInKmh' }
  | { kind: 'setValue'; field: string; hourIndex: number; value: number | null };

export interface StandInOptions {
  /** Added before every answer, ms (benchmarks). */
  latencyMs?: number;
  /** Initialisation time the metadata endpoint reports, epoch seconds. */
  runInitialisationSeconds?: number;
}

const EXTRAPOLATION_LAPSE_C_PER_KM = 6.5;

export class OpenMeteoStandIn {
  forecastRequests = 0;
  metaRequests = 0;
  readonly forecastUrls: URL[] = [];
  /** When each forecast request arrived, epoch ms. */
  readonly forecastArrivalsMs: number[] = [];
  /** Faults for the next forecast requests, one list per request, consumed in order. */
  readonly faultQueue: StandInFault[][] = [];
  /** Faults applied to every forecast request once the queue is empty. */
  persistentFaults: StandInFault[] = [];
  metadataFails = false;
  latencyMs: number;
  runInitialisationSeconds: number;

  private readonly server: Server;
  private readonly timers = new Set<NodeJS.Timeout>();
  private readonly demo = new DemoSource();
  private readonly seriesMemo = new Map<string, Promise<ProfileInput[]>>();

  private constructor(options: StandInOptions) {
    this.latencyMs = options.latencyMs ?? 0;
    this.runInitialisationSeconds = options.runInitialisationSeconds ?? Date.UTC(2026, 7, 14, 6) / 1000;
    this.server = createServer((request, response) => void this.handle(request, response));
    this.server.keepAliveTimeout = 1000;
  }

  static async start(options: StandInOptions = {}): Promise<OpenMeteoStandIn> {
    const standIn = new OpenMeteoStandIn(options);
    await new Promise<void>((resolve) => standIn.server.listen(0, '127.0.0.1', resolve));
    return standIn;
  }

  get baseUrl(): string {
    const address = this.server.address() as AddressInfo;
    return `http://127.0.0.1:${address.port}`;
  }

  async close(): Promise<void> {
    for (const timer of this.timers) clearTimeout(timer);
    this.timers.clear();
    this.server.closeAllConnections();
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }

  private wait(ms: number): Promise<void> {
    if (ms <= 0) return Promise.resolve();
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        this.timers.delete(timer);
        resolve();
      }, ms);
      this.timers.add(timer);
    });
  }

  private async handle(request: IncomingMessage, response: ServerResponse): Promise<void> {
    const url = new URL(request.url ?? '/', 'http://127.0.0.1');
    await this.wait(this.latencyMs);
    if (/^\/data\/[a-z0-9_]+\/static\/meta\.json$/.test(url.pathname)) return this.answerMeta(response);
    if (url.pathname !== '/v1/forecast') return send(response, 404, JSON.stringify({ error: true, reason: 'Not found' }));
    this.forecastRequests++;
    this.forecastUrls.push(url);
    this.forecastArrivalsMs.push(Date.now());
    const faults = this.faultQueue.shift() ?? this.persistentFaults;
    for (const fault of faults) {
      if (fault.kind === 'delay') await this.wait(fault.ms);
    }
    if (response.destroyed) return;
    const statusFault = faults.find((fault) => fault.kind === 'status');
    if (statusFault && statusFault.kind === 'status') {
      const headers: Record<string, string> = statusFault.retryAfter ? { 'retry-after': statusFault.retryAfter } : {};
      return send(response, statusFault.status, statusFault.body ?? JSON.stringify({ error: true, reason: `Injected status ${statusFault.status}` }), headers);
    }
    const built = await this.buildForecast(url, faults);
    if (response.destroyed) return;
    if (!built.ok) return send(response, 400, JSON.stringify({ error: true, reason: built.reason }));
    let body = JSON.stringify(built.body);
    if (faults.some((fault) => fault.kind === 'truncate')) body = body.slice(0, Math.floor(body.length / 2));
    send(response, 200, body);
  }

  private answerMeta(response: ServerResponse): void {
    this.metaRequests++;
    if (this.metadataFails) return send(response, 503, JSON.stringify({ error: true, reason: 'metadata unavailable (injected)' }));
    const init = this.runInitialisationSeconds;
    send(
      response,
      200,
      JSON.stringify({
        last_run_initialisation_time: init,
        last_run_modification_time: init + 4 * 3600,
        last_run_availability_time: init + 4 * 3600 + 300,
        temporal_resolution_seconds: 3600,
        update_interval_seconds: 21600,
        data_end_time: init + 16 * 86400,
      }),
    );
  }

  private async buildForecast(url: URL, faults: StandInFault[]): Promise<{ ok: true; body: unknown } | { ok: false; reason: string }> {
    const params = url.searchParams;
    const latitudes = (params.get('latitude') ?? '').split(',').map(Number);
    const longitudes = (params.get('longitude') ?? '').split(',').map(Number);
    const elevations = params.get('elevation')?.split(',').map(Number);
    if (latitudes.length !== longitudes.length || latitudes.some(Number.isNaN) || longitudes.some(Number.isNaN)) {
      return { ok: false, reason: 'Parameter latitude and longitude must have the same number of elements' };
    }
    const hourly = (params.get('hourly') ?? '').split(',').filter(Boolean);
    const known = /^(temperature_2m|dew_point_2m|surface_pressure|wind_speed_10m|wind_direction_10m|(temperature|dew_point|wind_speed|wind_direction|geopotential_height)_\d+hPa)$/;
    const unknown = hourly.find((name) => !known.test(name));
    if (unknown) return { ok: false, reason: `Cannot initialize SurfacePressureAndHeightVariable from invalid String value ${unknown}` };
    const startHour = params.get('start_hour');
    const endHour = params.get('end_hour');
    if (!startHour || !endHour) return { ok: false, reason: 'this stand-in needs start_hour and end_hour' };
    const startMs = Date.parse(`${startHour}:00Z`);
    const endMs = Date.parse(`${endHour}:00Z`);
    const hours = Math.round((endMs - startMs) / 3_600_000) + 1;
    if (!Number.isFinite(hours) || hours < 1 || hours > 384) return { ok: false, reason: 'Parameter end_hour is out of allowed range' };
    const windsInKmh = params.get('wind_speed_unit') !== 'ms' || faults.some((fault) => fault.kind === 'windsInKmh');

    const bodies = [];
    for (let index = 0; index < latitudes.length; index++) {
      const location = { latitude: latitudes[index], longitude: longitudes[index], elevationM: elevations?.[index] };
      const profiles = await this.demoProfiles(location, new Date(startMs).toISOString(), hours);
      bodies.push(locationBody(location, profiles, hourly, windsInKmh, faults));
    }
    return { ok: true, body: bodies.length === 1 ? bodies[0] : bodies };
  }

  private demoProfiles(location: { latitude: number; longitude: number; elevationM?: number }, startTime: string, hours: number): Promise<ProfileInput[]> {
    const key = `${location.latitude}|${location.longitude}|${location.elevationM}|${startTime}|${hours}`;
    let memo = this.seriesMemo.get(key);
    if (!memo) {
      memo = this.demo.fetchSeries(location, { startTime, hours }).then((result) => {
        if (!result.ok) throw new Error(result.error.message);
        return result.series.profiles;
      });
      this.seriesMemo.set(key, memo);
    }
    return memo;
  }
}

function send(response: ServerResponse, status: number, body: string, headers: Record<string, string> = {}): void {
  if (response.destroyed) return;
  response.writeHead(status, { 'content-type': 'application/json; charset=utf-8', ...headers });
  response.end(body);
}

function round(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
}

/** One location's answer, the way the documented API lays it out. */
function locationBody(
  location: { latitude: number; longitude: number; elevationM?: number },
  profiles: ProfileInput[],
  hourly: string[],
  windsInKmh: boolean,
  faults: StandInFault[],
) {
  const windFactor = windsInKmh ? 3.6 : 1;
  const units: Record<string, string> = { time: 'unixtime' };
  const values: Record<string, (number | null)[]> = { time: profiles.map((profile) => Date.parse(profile.validTime) / 1000) };
  for (const name of hourly) {
    const surfaceField = surfaceValue(name);
    if (surfaceField) {
      units[name] = surfaceField.unit === 'speed' ? (windsInKmh ? 'km/h' : 'm/s') : surfaceField.unit;
      values[name] = profiles.map((profile) => round(surfaceField.read(profile) * (surfaceField.unit === 'speed' ? windFactor : 1), 1));
      continue;
    }
    const match = /^(temperature|dew_point|wind_speed|wind_direction|geopotential_height)_(\d+)hPa$/.exec(name)!;
    const quantity = match[1];
    const pressureHpa = Number(match[2]);
    units[name] = { temperature: '°C', dew_point: '°C', wind_speed: windsInKmh ? 'km/h' : 'm/s', wind_direction: '°', geopotential_height: 'm' }[quantity]!;
    values[name] = profiles.map((profile) => {
      const level = levelAt(profile, pressureHpa);
      switch (quantity) {
        case 'temperature':
          return round(level.temperatureC, 1);
        case 'dew_point':
          return Math.min(round(level.dewpointC, 1), round(level.temperatureC, 1));
        case 'wind_speed':
          return round(level.windSpeedMs * windFactor, 1);
        case 'wind_direction':
          return Math.round(level.windDirDeg);
        default:
          return round(level.heightM, 1);
      }
    });
  }
  applyFieldFaults(values, units, faults);
  return {
    latitude: round(location.latitude, 2),
    longitude: round(location.longitude, 2),
    generationtime_ms: 0.5,
    utc_offset_seconds: 0,
    timezone: 'GMT',
    timezone_abbreviation: 'GMT',
    elevation: profiles[0].surface.elevationM,
    hourly_units: units,
    hourly: values,
  };
}

function surfaceValue(name: string): { unit: string; read: (profile: ProfileInput) => number } | null {
  switch (name) {
    case 'temperature_2m':
      return { unit: '°C', read: (profile) => profile.surface.temperatureC };
    case 'dew_point_2m':
      return { unit: '°C', read: (profile) => profile.surface.dewpointC };
    case 'surface_pressure':
      return { unit: 'hPa', read: (profile) => profile.surface.pressureHpa };
    case 'wind_speed_10m':
      return { unit: 'speed', read: (profile) => profile.surface.windSpeedMs };
    case 'wind_direction_10m':
      return { unit: '°', read: (profile) => profile.surface.windDirDeg };
    default:
      return null;
  }
}

/**
 * A level from the demo profile, or, under the ground, extrapolated from the surface the way
 * models fill such levels (hypsometric height below the ground, a standard lapse rate, surface wind).
 */
function levelAt(profile: ProfileInput, pressureHpa: number) {
  const level = profile.levels.find((candidate) => candidate.pressureHpa === pressureHpa);
  if (level) return level;
  const surface = profile.surface;
  const surfaceK = surface.temperatureC + 273.15;
  const depthM = ((287.04 * surfaceK) / 9.80665) * Math.log(pressureHpa / surface.pressureHpa);
  const temperatureC = surface.temperatureC + (EXTRAPOLATION_LAPSE_C_PER_KM * depthM) / 1000;
  return {
    pressureHpa,
    heightM: surface.elevationM - depthM,
    temperatureC,
    dewpointC: Math.min(surface.dewpointC, temperatureC),
    windDirDeg: surface.windDirDeg,
    windSpeedMs: surface.windSpeedMs,
  };
}

function applyFieldFaults(values: Record<string, (number | null)[]>, units: Record<string, string>, faults: StandInFault[]): void {
  for (const fault of faults) {
    if (fault.kind === 'dropFields') {
      for (const name of Object.keys(values)) {
        if (name !== 'time' && fault.match.test(name)) {
          delete values[name];
          delete units[name];
        }
      }
    } else if (fault.kind === 'nullValues' && values[fault.field]) {
      const series = values[fault.field];
      for (const hourIndex of fault.hourIndexes ?? series.map((_, index) => index)) series[hourIndex] = null;
    } else if (fault.kind === 'setValue' && values[fault.field]) {
      values[fault.field][fault.hourIndex] = fault.value;
    } else if (fault.kind === 'renameFields') {
      for (const name of Object.keys(values)) {
        if (name !== 'time' && name.includes(fault.from)) {
          const renamed = name.split(fault.from).join(fault.to);
          values[renamed] = values[name];
          units[renamed] = units[name];
          delete values[name];
          delete units[name];
        }
      }
    }
  }
}
