import type { RESTOptions } from 'discord.js';
import { discordRestBase } from './fetchRequest.ts';

/** A ceiling for our own client-side queue, far above any burst an incident channel produces. */
const INTERACTION_REPLIES_PER_SECOND = 1000;

/**
 * REST options for the calls that answer an interaction: the edit of the deferred reply (the
 * deferral itself goes out straight from the gateway packet, deferInteraction.ts). Discord's
 * interaction endpoints are not bound to the bot's global rate limit (Discord developer docs,
 * "Receiving and Responding": endpoints), so the library's client-side 50 requests/s default
 * would queue answers for no reason under a burst; per-route limits and 429 answers are still
 * honoured. Channel posts go through the outbox's poster, a separate REST client
 * that keeps the default.
 */
export function interactionRestOptions(apiUrl: string | undefined): Partial<RESTOptions> {
  return { ...discordRestBase(apiUrl), globalRequestsPerSecond: INTERACTION_REPLIES_PER_SECOND };
}
