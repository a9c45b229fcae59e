import { resolve } from 'node:path';
import type { AppConfig } from '../config/appConfig.ts';
import { DEMO_MODEL, DemoSource } from '../forecast/demoSource.ts';
import { DEMO_PLACES, findDemoPlace } from '../forecast/demoPlaces.ts';
import { FileSource } from '../forecast/fileSource.ts';
import { ForecastCache } from '../forecast/forecastCache.ts';
import type { ForecastLocation, ForecastSource } from '../forecast/forecastSource.ts';
import { OpenMeteoSource } from '../forecast/openMeteoSource.ts';
import { instrumentedSource } from './instrumentedSource.ts';

export interface ConfiguredSource {
  /** The source behind the in-process cache. */
  source: ForecastSource;
  /** Named shortcuts the source knows (the demo's invented places). */
  findNamedPlace: (name: string) => ForecastLocation | null;
  suggestedPlaceNames: string[];
  invented: boolean;
}

/** The forecast source the config asks for, behind one cache so many channels make one request. */
export function buildForecastSource(config: AppConfig['forecast'], nowMs: () => number = Date.now): ConfiguredSource {
  const setting = config.source;
  if (setting === 'demo') {
    return {
      source: new ForecastCache(instrumentedSource(new DemoSource()), { model: DEMO_MODEL }, nowMs),
      findNamedPlace: (name) => {
        const place = findDemoPlace(name);
        return place ? { latitude: place.latitude, longitude: place.longitude, elevationM: place.elevationM, name: place.name } : null;
      },
      suggestedPlaceNames: DEMO_PLACES.map((place) => place.name),
      invented: true,
    };
  }
  if (setting === 'http') {
    return {
      source: new ForecastCache(instrumentedSource(new OpenMeteoSource(config.openMeteo, { nowMs })), { model: config.openMeteo.model }, nowMs),
      findNamedPlace: () => null,
      suggestedPlaceNames: [],
      invented: false,
    };
  }
  const directory = resolve(setting.slice('files:'.length));
  return { source: instrumentedSource(new FileSource({ directory })), findNamedPlace: () => null, suggestedPlaceNames: [], invented: false };
}
