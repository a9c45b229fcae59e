import type { Message } from '../../render/message.ts';
import { describePoint } from '../resolvePlace.ts';
import { errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import type { HandlerContext } from '../routerContext.ts';

export async function savePlace(context: HandlerContext, name: string, latitudeDeg: number, longitudeDeg: number): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const result = await context.store.places.savePlace(context.channel.id, { name, latitudeDeg, longitudeDeg }, context.nowMs());
  if (!result.ok) {
    return errorMessage(
      `"${result.existing.name}" is already saved here (${describePoint(result.existing.latitudeDeg, result.existing.longitudeDeg)}). Remove it first with \`forget ${result.existing.name}\` or pick another name. Nothing was changed.`,
      context.localFooterLine,
    );
  }
  return noticeMessage(`Saved "${result.place.name}" at ${describePoint(latitudeDeg, longitudeDeg)}.`, [`Look it up with \`${result.place.name}\`, or watch it with \`watch ${result.place.name}\`.`], context.localFooterLine);
}

export async function listPlaces(context: HandlerContext): Promise<Message> {
  const places = await context.store.places.listPlaces(context.channel.id);
  if (places.length === 0) return noticeMessage('No saved places in this channel yet.', ['Save one: `save Cinder Ridge 44.81,-115.43`'], context.localFooterLine);
  return noticeMessage(
    `Saved places (${places.length})`,
    places.map((place) => `${place.name}: ${describePoint(place.latitudeDeg, place.longitudeDeg)}`),
    context.localFooterLine,
  );
}

export async function forgetPlace(context: HandlerContext, name: string): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const removed = await context.store.places.removePlace(context.channel.id, name);
  if (!removed) return errorMessage(`No saved place called "${name}" here; \`places\` lists them. Nothing was changed.`, context.localFooterLine);
  return noticeMessage(`Removed "${name}".`, ['Any watch made from it keeps running; stop it with `unwatch` and the point.'], context.localFooterLine);
}
