import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { z } from 'zod';
import type { ProfileInput } from '../core/profile.ts';
import { parseProfileText } from '../profile/parseProfileText.ts';
import { describeLocation } from './describeLocation.ts';
import { checkForecastRequest, isoHour } from './forecastRequestSchema.ts';
import { forecastFailure } from './forecastFailure.ts';
import type { ForecastLocation, ForecastResult, ForecastSource, ForecastWindow } from './forecastSource.ts';

export const fileSourceConfigSchema = z.object({
  /** Folder holding one profile file (.json or .csv) per valid hour. */
  directory: z.string().min(1),
  /**
   * Files whose profile lies farther than this from the asked point are refused, so that a folder
   * for one fire never answers for another. Null turns the check off.
   */
  maxDistanceKm: z.number().positive().nullable().default(50),
  /** Name of the model or instrument behind the files, shown in messages. */
  model: z.string().min(1).default('files'),
});

export type FileSourceConfigInput = z.input<typeof fileSourceConfigSchema>;

const PROFILE_FILE = /\.(json|csv)$/i;
const EARTH_RADIUS_KM = 6371;

/**
 * Profiles a user brings: model output or balloon soundings, one file per valid hour, in the JSON or
 * CSV of the analyze contract. Every file in the folder is read on each request (the folder may be
 * filling up); any unreadable file refuses the whole series with that file named.
 */
export class FileSource implements ForecastSource {
  readonly name: string;
  private readonly config: z.output<typeof fileSourceConfigSchema>;

  constructor(configInput: FileSourceConfigInput) {
    const parsed = fileSourceConfigSchema.safeParse(configInput);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      throw new Error(`file source config is not usable: ${issue.path.join('.') || 'config'}: ${issue.message}. Example: { directory: "./profiles", maxDistanceKm: 50 }`);
    }
    this.config = parsed.data;
    this.name = `files (${this.config.directory})`;
  }

  async fetchMany(locations: ForecastLocation[], window: ForecastWindow): Promise<ForecastResult[]> {
    return Promise.all(locations.map((location) => this.fetchSeries(location, window)));
  }

  async fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult> {
    const check = checkForecastRequest(location, window);
    if (!check.ok) return forecastFailure('client', this.name, location, check.reason);
    const { startMs, validTimesMs } = check.window;
    const endMs = validTimesMs[validTimesMs.length - 1];

    let fileNames: string[];
    try {
      fileNames = (await readdir(this.config.directory)).filter((fileName) => PROFILE_FILE.test(fileName)).sort();
    } catch (error) {
      return forecastFailure('no-data', this.name, location, `the folder ${this.config.directory} cannot be read (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})`);
    }
    if (fileNames.length === 0) {
      return forecastFailure('no-data', this.name, location, `the folder ${this.config.directory} holds no .json or .csv profile files`);
    }

    const inWindow: { fileName: string; profile: ProfileInput; validMs: number }[] = [];
    const seenHours = new Map<number, string>();
    for (const fileName of fileNames) {
      let text: string;
      try {
        text = await readFile(join(this.config.directory, fileName), 'utf8');
      } catch (error) {
        return forecastFailure('bad-profile', this.name, location, `the file ${fileName} cannot be read (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})`);
      }
      const parsed = parseProfileText(text, fileName);
      if (!parsed.ok) return forecastFailure('bad-profile', this.name, location, `the file is not a usable profile: ${parsed.error}`);
      const validMs = Date.parse(parsed.profile.validTime);
      if (Number.isNaN(validMs)) {
        return forecastFailure('bad-profile', this.name, location, `the file ${fileName} has validTime "${parsed.profile.validTime}", not an ISO 8601 instant such as 2026-08-14T21:00:00Z`);
      }
      const previous = seenHours.get(validMs);
      if (previous) {
        return forecastFailure('bad-profile', this.name, location, `the files ${previous} and ${fileName} are both for ${isoHour(validMs)}; keep one file per valid hour`);
      }
      seenHours.set(validMs, fileName);
      if (validMs < startMs || validMs > endMs) continue;
      const distanceProblem = this.distanceProblem(parsed.profile, location, fileName);
      if (distanceProblem) return forecastFailure('no-data', this.name, location, distanceProblem);
      inWindow.push({ fileName, profile: parsed.profile, validMs });
    }

    if (inWindow.length === 0) {
      return forecastFailure('no-data', this.name, location, `none of the ${fileNames.length} files has a validTime from ${isoHour(startMs)} to ${isoHour(endMs)}`);
    }
    inWindow.sort((a, b) => a.validMs - b.validMs);
    const notes: string[] = [];
    if (inWindow.length < validTimesMs.length) {
      notes.push(`${inWindow.length} of the ${validTimesMs.length} hours asked have a profile file; the hours without one are absent, not quiet.`);
    }
    const first = inWindow[0].profile;
    return {
      ok: true,
      series: {
        location: { ...location, elevationM: location.elevationM ?? first.surface.elevationM },
        sourceName: this.name,
        model: this.config.model,
        // Files carry no model run; the earliest valid time stands in for it.
        runTime: isoHour(inWindow[0].validMs),
        providerUnits: { temperature: '°C', windSpeed: 'm/s', geopotentialHeight: 'm', surfacePressure: 'hPa' },
        invented: false,
        profiles: inWindow.map((entry) => entry.profile),
        notes,
      },
    };
  }

  private distanceProblem(profile: ProfileInput, location: ForecastLocation, fileName: string): string | null {
    if (this.config.maxDistanceKm === null) return null;
    if (typeof profile.latitude !== 'number' || typeof profile.longitude !== 'number') return null;
    const distanceKm = greatCircleKm(profile.latitude, profile.longitude, location.latitude, location.longitude);
    if (distanceKm <= this.config.maxDistanceKm) return null;
    return `the file ${fileName} is for ${profile.latitude.toFixed(3)}, ${profile.longitude.toFixed(3)}, ${distanceKm.toFixed(0)} km from ${describeLocation(location)}, more than the ${this.config.maxDistanceKm} km allowed`;
  }
}

function greatCircleKm(latitudeA: number, longitudeA: number, latitudeB: number, longitudeB: number): number {
  const toRad = Math.PI / 180;
  const dLat = (latitudeB - latitudeA) * toRad;
  const dLon = (longitudeB - longitudeA) * toRad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(latitudeA * toRad) * Math.cos(latitudeB * toRad) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_KM * Math.asin(Math.min(1, Math.sqrt(h)));
}
