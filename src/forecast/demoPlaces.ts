/**
 * The demo's named places. All invented, as is the incident they belong to: the coordinates are
 * plausible for the interior West of North America and describe no real site.
 */
export const DEMO_SCENARIO_NAME = 'Kestrel Bench Fire (invented scenario)';

export interface DemoPlace {
  name: string;
  latitude: number;
  longitude: number;
  elevationM: number;
  description: string;
}

export const DEMO_PLACES: readonly DemoPlace[] = [
  {
    name: 'Kestrel Bench ICP',
    latitude: 43.62,
    longitude: -115.48,
    elevationM: 1450,
    description: 'Invented incident command post on a sage bench above the river.',
  },
  {
    name: 'Sawback Lookout',
    latitude: 43.71,
    longitude: -115.31,
    elevationM: 2210,
    description: "Invented ridge-top lookout on the fire's north flank.",
  },
  {
    name: 'Alder Sink',
    latitude: 43.49,
    longitude: -115.66,
    elevationM: 960,
    description: 'Invented valley-floor town downwind of the fire.',
  },
];

/** Case- and space-insensitive lookup of a demo place by name. */
export function findDemoPlace(name: string): DemoPlace | undefined {
  const wanted = name.trim().toLowerCase().replace(/\s+/g, ' ');
  return DEMO_PLACES.find((place) => place.name.toLowerCase() === wanted);
}

/** The demo place at these coordinates (within about a kilometre), if any. */
export function demoPlaceAt(latitude: number, longitude: number): DemoPlace | undefined {
  return DEMO_PLACES.find((place) => Math.abs(place.latitude - latitude) < 0.01 && Math.abs(place.longitude - longitude) < 0.01);
}
