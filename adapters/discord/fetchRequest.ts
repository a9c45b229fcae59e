import type { RESTOptions } from 'discord.js';
import { nodeHttpFetch } from '../http/nodeHttpFetch.ts';

/**
 * The request strategy for every Discord REST client we make: our node:http transport.
 *
 * @discordjs/rest's default strategy calls its bundled undici 6 `request`, which sends through
 * the process-wide undici dispatcher. Once undici 7 is loaded (Slack's Socket Mode client loads
 * it, and it installs its own global dispatcher), multipart bodies built from undici 6's FormData
 * fail ("action is not a function"), so replies with PNG attachments would never arrive when
 * Slack and Discord run in one process. nodeHttpFetch encodes the FormData itself and sends
 * through node:http, whatever the dispatcher, at a fraction of fetch's CPU per call.
 */
const fetchRequest: RESTOptions['makeRequest'] = (url, init) => nodeHttpFetch(url, init as RequestInit) as ReturnType<RESTOptions['makeRequest']>;

/** What every Discord REST client we make shares: this transport, and the configured API base when there is one. */
export function discordRestBase(apiUrl: string | undefined): Pick<RESTOptions, 'makeRequest'> & Partial<Pick<RESTOptions, 'api'>> {
  return { makeRequest: fetchRequest, ...(apiUrl ? { api: apiUrl } : {}) };
}
