import { nodeHttpFetch } from '../http/nodeHttpFetch.ts';

/**
 * The options every Web API client of ours shares: the API base, when one is configured (the
 * client joins method names onto it, so it ends in "/"), and the node:http transport
 * (adapters/http/nodeHttpFetch.ts says why).
 */
export function slackClientBaseOptions(apiUrl: string | undefined): { slackApiUrl?: string; fetch: typeof nodeHttpFetch } {
  if (!apiUrl) return { fetch: nodeHttpFetch };
  return { slackApiUrl: apiUrl.endsWith('/') ? apiUrl : `${apiUrl}/`, fetch: nodeHttpFetch };
}

/**
 * Web API client options for answering a person: a couple of quick retries, not the client's
 * default of ten over thirty minutes: an answer that late is no answer, and pending retries keep
 * the process from exiting. (Scheduled posts use the outbox's own retry policy instead.)
 */
export function answerClientOptions(apiUrl: string | undefined, timeoutMs = 10_000) {
  return { ...slackClientBaseOptions(apiUrl), retryConfig: { retries: 2, minTimeout: 500, maxTimeout: 2_000 }, timeout: timeoutMs };
}
