/** Saved places: named points per channel, unique by name ignoring case. */
import type { StoreContext } from './storeContext.ts';
import type { PlaceRepository, SavedPlace } from './storeTypes.ts';
import { newId } from './newId.ts';
import { requireChannelRef } from './requireChannelRef.ts';
import { toSavedPlace } from './rowMappers.ts';
import { placeNameKey } from './storeKeys.ts';
import { epochMsSchema, idSchema, newSavedPlaceSchema, parseInput, placeNameSchema } from './storeInputSchemas.ts';

export function createPlaceRepository({ db }: StoreContext): PlaceRepository {
  async function findPlace(channelRef: string, name: string): Promise<SavedPlace | null> {
    parseInput(idSchema, channelRef, 'channel id');
    const cleanName = parseInput(placeNameSchema, name, 'place name');
    const row = await db
      .selectFrom('places')
      .selectAll()
      .where('channel_ref', '=', channelRef)
      .where('name_key', '=', placeNameKey(cleanName))
      .executeTakeFirst();
    return row === undefined ? null : toSavedPlace(row);
  }

  return {
    findPlace,

    async savePlace(channelRef, place, nowMs) {
      parseInput(idSchema, channelRef, 'channel id');
      const p = parseInput(newSavedPlaceSchema, place, 'saved place');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const id = newId();
      await requireChannelRef(db, channelRef);
      // The unique (channel, name_key) constraint decides a race between two saves of one name.
      const result = await db
        .insertInto('places')
        .values({
          id,
          channel_ref: channelRef,
          name: p.name,
          name_key: placeNameKey(p.name),
          latitude_deg: p.latitudeDeg,
          longitude_deg: p.longitudeDeg,
          elevation_m: p.elevationM ?? null,
          time_zone: p.timeZone ?? null,
          created_at_ms: nowMs,
        })
        .onConflict((oc) => oc.columns(['channel_ref', 'name_key']).doNothing())
        .executeTakeFirst();
      const saved = await findPlace(channelRef, p.name);
      if (saved === null) throw new Error(`place "${p.name}" vanished right after it was saved`);
      if (Number(result.numInsertedOrUpdatedRows ?? 0) === 0 || saved.id !== id) {
        return {
          ok: false,
          reason: 'name-taken',
          existing: saved,
          message: `This channel already has a place called "${saved.name}". Remove it first or choose another name.`,
        };
      }
      return { ok: true, place: saved };
    },

    async listPlaces(channelRef) {
      parseInput(idSchema, channelRef, 'channel id');
      const rows = await db.selectFrom('places').selectAll().where('channel_ref', '=', channelRef).orderBy('name_key').execute();
      return rows.map(toSavedPlace);
    },

    async removePlace(channelRef, name) {
      parseInput(idSchema, channelRef, 'channel id');
      const cleanName = parseInput(placeNameSchema, name, 'place name');
      const result = await db
        .deleteFrom('places')
        .where('channel_ref', '=', channelRef)
        .where('name_key', '=', placeNameKey(cleanName))
        .executeTakeFirst();
      return Number(result.numDeletedRows) > 0;
    },
  };
}
