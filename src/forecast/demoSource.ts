import { checkForecastRequest, isoHour } from './forecastRequestSchema.ts';
import { forecastFailure } from './forecastFailure.ts';
import type { ForecastLocation, ForecastResult, ForecastSource, ForecastWindow } from './forecastSource.ts';
import { DEFAULT_DEMO_SCENARIO, demoProfile, type DemoScenarioParameters, type ScenarioClock } from './demoScenario.ts';
import { DEMO_SCENARIO_NAME, demoPlaceAt } from './demoPlaces.ts';
import { calendarDaysBetween, localClock, nextCalendarDate, timeZoneAt } from './pointTimeZone.ts';

export const DEMO_SOURCE_NAME = 'demo (invented data)';
export const DEMO_MODEL = 'demo-scenario';

export interface DemoSourceOptions {
  parameters?: Partial<DemoScenarioParameters>;
  /** Terrain height assumed where the caller gives none and the point is not a demo place, m. */
  assumedElevationM?: number;
}

const HALF_DAY_MS = 12 * 3_600_000;
/** A window starting before this local hour has its first afternoon the same day. */
const FIRST_AFTERNOON_CUTOFF_LOCAL_HOUR = 13;

/**
 * The embedded default source: two (or more) days of invented hourly profiles for any point, built
 * by the demo scenario. The scenario's first day is the first afternoon the window covers, so every
 * window shows the afternoon coupling once it reaches that afternoon. Nothing is fetched.
 */
export class DemoSource implements ForecastSource {
  readonly name = DEMO_SOURCE_NAME;
  private readonly parameters: DemoScenarioParameters;
  private readonly assumedElevationM: number;

  constructor(options: DemoSourceOptions = {}) {
    this.parameters = { ...DEFAULT_DEMO_SCENARIO, ...options.parameters };
    this.assumedElevationM = options.assumedElevationM ?? 1200;
  }

  async fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult> {
    return this.seriesFor(location, window);
  }

  async fetchMany(locations: ForecastLocation[], window: ForecastWindow): Promise<ForecastResult[]> {
    return locations.map((location) => this.seriesFor(location, window));
  }

  private seriesFor(location: ForecastLocation, window: ForecastWindow): ForecastResult {
    const check = checkForecastRequest(location, window);
    if (!check.ok) return forecastFailure('client', this.name, location, check.reason);
    const { startMs, validTimesMs } = check.window;
    const place = demoPlaceAt(location.latitude, location.longitude);
    const elevationM = location.elevationM ?? place?.elevationM ?? this.assumedElevationM;
    const name = location.name ?? place?.name ?? `demo point ${location.latitude.toFixed(3)}, ${location.longitude.toFixed(3)}`;
    const timeZone = timeZoneAt(location.latitude, location.longitude);
    const start = localClock(startMs, timeZone);
    const firstDay = start.localHour < FIRST_AFTERNOON_CUTOFF_LOCAL_HOUR ? start.localDate : nextCalendarDate(start.localDate);
    const site = { latitude: location.latitude, longitude: location.longitude, elevationM };

    const profiles = validTimesMs.map((validMs) => {
      const local = localClock(validMs, timeZone);
      const clock: ScenarioClock = { dayIndex: calendarDaysBetween(firstDay, local.localDate), localHour: local.localHour };
      return demoProfile(site, clock, isoHour(validMs), name, this.parameters);
    });

    const notes = [`${DEMO_SCENARIO_NAME}: invented data for trying the bot, not a forecast; day one of the scenario is ${firstDay} (${timeZone}).`];
    if (location.elevationM === undefined && !place) notes.push(`No terrain height was given for this point; the scenario assumes ${elevationM} m.`);
    return {
      ok: true,
      series: {
        location: { ...location, elevationM, name },
        sourceName: this.name,
        model: DEMO_MODEL,
        // The invented "run" is the last 00 or 12 UTC before the window.
        runTime: isoHour(Math.floor((startMs - 1) / HALF_DAY_MS) * HALF_DAY_MS),
        providerUnits: { temperature: '°C', windSpeed: 'm/s', geopotentialHeight: 'm', surfacePressure: 'hPa' },
        invented: true,
        profiles,
        notes,
      },
    };
  }
}
