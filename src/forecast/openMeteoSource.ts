import { checkForecastRequest, type CheckedWindow } from './forecastRequestSchema.ts';
import { forecastFailure } from './forecastFailure.ts';
import type { ForecastErrorKind, ForecastLocation, ForecastResult, ForecastSource, ForecastWindow } from './forecastSource.ts';
import { httpGetText, type HttpFailureKind } from './httpGetText.ts';
import { parseOpenMeteoConfig, type OpenMeteoConfig, type OpenMeteoConfigInput } from './openMeteoConfig.ts';
import { openMeteoProfiles } from './openMeteoProfiles.ts';
import { openMeteoForecastUrl } from './openMeteoRequestUrl.ts';
import { openMeteoErrorSchema, openMeteoLocationSchema } from './openMeteoResponseSchema.ts';
import { OpenMeteoRunTimeLookup } from './openMeteoRunTime.ts';
import { describeLocation } from './describeLocation.ts';

export interface OpenMeteoSourceOptions {
  /** Jitter source for the retry backoff; Math.random by default. */
  random?: () => number;
  nowMs?: () => number;
}

const HTTP_KIND: Record<HttpFailureKind, ForecastErrorKind> = {
  timeout: 'timeout',
  network: 'network',
  'rate-limited': 'rate-limited',
  server: 'server',
  client: 'client',
};

/**
 * Forecast profiles from Open-Meteo's keyless /v1/forecast API (or any server that speaks it):
 * surface fields and pressure levels, hourly, for one model. Several locations travel in one request.
 */
export class OpenMeteoSource implements ForecastSource {
  readonly name: string;
  readonly config: OpenMeteoConfig;
  private readonly runTimes: OpenMeteoRunTimeLookup;

  /** Throws on a bad config, with the key and the reason: config is checked once, at start-up. */
  constructor(configInput: OpenMeteoConfigInput = {}, private readonly options: OpenMeteoSourceOptions = {}) {
    const parsed = parseOpenMeteoConfig(configInput);
    if (!parsed.ok) throw new Error(parsed.error);
    this.config = parsed.config;
    this.name = `open-meteo (${this.config.model})`;
    this.runTimes = new OpenMeteoRunTimeLookup(this.config, options.nowMs);
  }

  async fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult> {
    const [result] = await this.fetchMany([location], window);
    return result;
  }

  /** From the metadata API (reused for metadataReuseMs); null when only a derived guess is at hand. */
  async latestRunTime(): Promise<string | null> {
    const run = await this.runTimes.current();
    return run.note === undefined ? run.runTime : null;
  }

  async fetchMany(locations: ForecastLocation[], window: ForecastWindow): Promise<ForecastResult[]> {
    const results: ForecastResult[] = new Array(locations.length);
    // Locations that give a terrain height and those that do not cannot share the elevation parameter.
    const groups = new Map<string, { index: number; location: ForecastLocation }[]>();
    let checkedWindow: CheckedWindow | null = null;
    locations.forEach((location, index) => {
      const check = checkForecastRequest(location, window);
      if (!check.ok) {
        results[index] = forecastFailure('client', this.name, location, check.reason);
        return;
      }
      checkedWindow = check.window;
      const key = location.elevationM === undefined ? 'terrain-from-provider' : 'terrain-given';
      if (!groups.has(key)) groups.set(key, []);
      groups.get(key)!.push({ index, location });
    });
    if (checkedWindow === null) return results;
    const windowChecked: CheckedWindow = checkedWindow;

    const batches: { index: number; location: ForecastLocation }[][] = [];
    for (const members of groups.values()) {
      for (let start = 0; start < members.length; start += this.config.maxLocationsPerRequest) {
        batches.push(members.slice(start, start + this.config.maxLocationsPerRequest));
      }
    }
    const runTimePromise = this.runTimes.current();
    await Promise.all(
      batches.map(async (batch) => {
        const batchResults = await this.fetchBatch(batch.map((member) => member.location), windowChecked, runTimePromise);
        batch.forEach((member, position) => {
          results[member.index] = batchResults[position];
        });
      }),
    );
    return results;
  }

  private async fetchBatch(
    locations: ForecastLocation[],
    window: CheckedWindow,
    runTimePromise: ReturnType<OpenMeteoRunTimeLookup['current']>,
  ): Promise<ForecastResult[]> {
    const failAll = (kind: ForecastErrorKind, cause: string) =>
      locations.map((location) => forecastFailure(kind, this.name, location, cause));
    const url = openMeteoForecastUrl(this.config, locations, window.startMs, window.hours);
    const answer = await httpGetText(url, {
      policy: this.config,
      random: this.options.random,
      headers: { accept: 'application/json' },
    });
    if (!answer.ok) {
      const hint = answer.kind === 'client' ? '; not retried, since the same request would be refused again: check the configured model and levels' : '';
      return failAll(HTTP_KIND[answer.kind], `${answer.cause}${hint}`);
    }

    let body: unknown;
    try {
      body = JSON.parse(answer.bodyText);
    } catch (error) {
      return failAll('bad-response', `the answer is not complete JSON (${(error as Error).message}; ${answer.bodyText.length} bytes received), perhaps cut off in transit`);
    }
    const providerError = openMeteoErrorSchema.safeParse(body);
    if (providerError.success) return failAll('bad-response', `the provider reported an error: "${providerError.data.reason}"`);

    // One coordinate gives one object; several give a list in the same order (documented).
    const items: unknown[] = locations.length === 1 && !Array.isArray(body) ? [body] : Array.isArray(body) ? body : [];
    if (items.length !== locations.length) {
      return failAll('bad-response', `the answer holds ${Array.isArray(body) ? items.length : 'no list of'} location${items.length === 1 ? '' : 's'} for the ${locations.length} asked`);
    }
    const runTime = await runTimePromise;

    return locations.map((location, position) => {
      const parsed = openMeteoLocationSchema.safeParse(items[position]);
      if (!parsed.success) {
        const issue = parsed.error.issues[0];
        return forecastFailure('bad-response', this.name, location, `the answer does not have the documented shape (${issue.path.join('.') || 'body'}: ${issue.message})`);
      }
      const conversion = openMeteoProfiles(parsed.data, window.validTimesMs, {
        pressureLevelsHpa: this.config.pressureLevelsHpa,
        upperLevelBelowPressureHpa: this.config.upperLevelBelowPressureHpa,
        maxDroppedUpperLevels: this.config.maxDroppedUpperLevels,
        profileName: location.name ?? describeLocation(location),
        latitude: location.latitude,
        longitude: location.longitude,
      });
      if (!conversion.ok) return forecastFailure(conversion.kind, this.name, location, conversion.cause);
      const notes = [...conversion.notes];
      if (runTime.note) notes.push(runTime.note);
      return {
        ok: true,
        series: {
          location: { ...location, elevationM: location.elevationM ?? parsed.data.elevation },
          sourceName: this.name,
          model: this.config.model,
          runTime: runTime.runTime,
          providerUnits: conversion.providerUnits,
          invented: false,
          profiles: conversion.profiles,
          notes,
        },
      };
    });
  }
}
