import type { Message } from '../../render/message.ts';
import type { PlaceRef } from '../commandGrammar.ts';
import { CANNOT_POST_HERE, errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import { describePoint, resolvePlace } from '../resolvePlace.ts';
import type { HandlerContext } from '../routerContext.ts';

export async function startWatching(context: HandlerContext, ref: PlaceRef): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  if (context.request.botCanPost === false) return errorMessage(CANNOT_POST_HERE, context.localFooterLine);
  const resolved = await resolvePlace(context, ref);
  if (!resolved.ok) return errorMessage(resolved.error, context.localFooterLine);
  const { place } = resolved;
  const { created } = await context.store.watches.addWatch(
    context.channel.id,
    { placeName: place.savedName, latitudeDeg: place.latitudeDeg, longitudeDeg: place.longitudeDeg, elevationM: place.elevationM, createdBy: context.request.userId },
    context.nowMs(),
  );
  const summary = context.channel.summaryLocalTime ? `Morning summary at ${context.channel.summaryLocalTime} local time.` : 'Morning summary is off (`morning 06:30` turns it on).';
  const confirmation = noticeMessage(
    created ? `Watching ${place.displayName}: alerts on.` : `Already watching ${place.displayName}; alerts stay on.`,
    [`The alerts that stand come in one message at the next check; after that, each new one on its own. Checked every half hour and after each new model run. ${summary}`, `Stop with \`unwatch ${place.savedName ?? `${place.latitudeDeg},${place.longitudeDeg}`}\`.`],
    context.localFooterLine,
  );
  return { ...confirmation, postsToChannel: true };
}

export async function stopWatching(context: HandlerContext, ref: PlaceRef): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const resolved = await resolvePlace(context, ref);
  if (!resolved.ok) return errorMessage(resolved.error, context.localFooterLine);
  const stopped = await context.store.watches.deactivateWatch(context.channel.id, resolved.place.locationKey);
  if (!stopped) return errorMessage(`This channel was not watching ${resolved.place.displayName}; \`watching\` lists what it watches. Nothing was changed.`, context.localFooterLine);
  return noticeMessage(`Stopped watching ${resolved.place.displayName}: no more alerts or summaries for it here.`, [], context.localFooterLine);
}

export async function listWatching(context: HandlerContext): Promise<Message> {
  const watches = await context.store.watches.listWatches(context.channel.id);
  if (watches.length === 0) return noticeMessage('This channel watches no place.', ['Start with `watch Cinder Ridge` or `watch 44.8N 115.4W`.'], context.localFooterLine);
  const summary = context.channel.summaryLocalTime ? `morning summary ${context.channel.summaryLocalTime} local` : 'morning summary off';
  return noticeMessage(
    `Watching ${watches.length} place${watches.length === 1 ? '' : 's'} (${summary}, units ${context.channel.unitSystem})`,
    watches.map((watch) => `${watch.placeName ?? 'point'}: ${describePoint(watch.latitudeDeg, watch.longitudeDeg)}`),
    context.localFooterLine,
  );
}
