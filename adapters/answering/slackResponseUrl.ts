import { nodeHttpFetch } from '../http/nodeHttpFetch.ts';

/**
 * Posts a reply to a Slack response URL (a plain HTTPS POST of the message JSON, no token), through
 * the same node:http transport as the platform clients: a fraction of fetch's CPU per call, and
 * every command makes one. An answer that cannot be delivered in `timeoutMs` is a failure the
 * caller logs: it is late anyway.
 */
export async function postToResponseUrl(responseUrl: string, body: Record<string, unknown>, timeoutMs: number): Promise<void> {
  let response: Response;
  try {
    response = await nodeHttpFetch(responseUrl, {
      method: 'POST',
      headers: { 'content-type': 'application/json; charset=utf-8' },
      body: JSON.stringify(body),
      signal: AbortSignal.timeout(timeoutMs),
    });
  } catch (error) {
    if (error instanceof Error && error.name === 'TimeoutError') throw new Error(`response URL did not answer within ${timeoutMs} ms`);
    throw error;
  }
  if (response.ok) return;
  const text = await response.text();
  throw new Error(`response URL answered HTTP ${response.status}${text.length > 0 ? `: ${text.slice(0, 200)}` : ''}`);
}
