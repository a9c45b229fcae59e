import { locationKeyOf } from '../store/storeKeys.ts';
import type { PlaceRef } from './commandGrammar.ts';
import type { HandlerContext } from './routerContext.ts';

export interface ResolvedPlace {
  /** What the user sees: the saved or demo name, or the point itself. */
  displayName: string;
  /** The saved place's name when it came from one; null for a typed point. */
  savedName: string | null;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number | null;
  locationKey: string;
}

export type PlaceResolution = { ok: true; place: ResolvedPlace } | { ok: false; error: string };

/** A typed point, else this channel's saved place, else a named shortcut of the source (demo places). */
export async function resolvePlace(context: HandlerContext, ref: PlaceRef): Promise<PlaceResolution> {
  if (ref.kind === 'point') {
    return {
      ok: true,
      place: {
        displayName: describePoint(ref.latitudeDeg, ref.longitudeDeg),
        savedName: null,
        latitudeDeg: ref.latitudeDeg,
        longitudeDeg: ref.longitudeDeg,
        elevationM: null,
        locationKey: locationKeyOf(ref.latitudeDeg, ref.longitudeDeg),
      },
    };
  }
  const saved = await context.store.places.findPlace(context.channel.id, ref.name);
  if (saved) {
    return {
      ok: true,
      place: {
        displayName: saved.name,
        savedName: saved.name,
        latitudeDeg: saved.latitudeDeg,
        longitudeDeg: saved.longitudeDeg,
        elevationM: saved.elevationM,
        locationKey: locationKeyOf(saved.latitudeDeg, saved.longitudeDeg),
      },
    };
  }
  const named = context.findNamedPlace(ref.name);
  if (named) {
    return {
      ok: true,
      place: {
        displayName: named.name ?? ref.name,
        savedName: named.name ?? ref.name,
        latitudeDeg: named.latitude,
        longitudeDeg: named.longitude,
        elevationM: named.elevationM ?? null,
        locationKey: locationKeyOf(named.latitude, named.longitude),
      },
    };
  }
  return {
    ok: false,
    error: `No place called "${ref.name}" in this channel. Save it first (\`save ${ref.name} 44.81,-115.43\`) or give a point such as \`44.8N 115.4W\`; \`places\` lists the saved ones.`,
  };
}

/** A point as people read it: "44.80°N 115.40°W". */
export function describePoint(latitudeDeg: number, longitudeDeg: number): string {
  return `${formatDegrees(latitudeDeg, 'N', 'S')} ${formatDegrees(longitudeDeg, 'E', 'W')}`;
}

function formatDegrees(value: number, positive: string, negative: string): string {
  return `${Math.abs(value).toFixed(2)}°${value >= 0 ? positive : negative}`;
}
