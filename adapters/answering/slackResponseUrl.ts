/**
 * Posts a reply to a Slack response URL (a plain HTTPS POST of the message JSON, no token). An
 * answer that cannot be delivered in `timeoutMs` is a failure the caller logs: it is late anyway.
 */
export async function postToResponseUrl(responseUrl: string, body: Record<string, unknown>, timeoutMs: number): Promise<void> {
  const response = await fetch(responseUrl, {
    method: 'POST',
    headers: { 'content-type': 'application/json; charset=utf-8' },
    body: JSON.stringify(body),
    signal: AbortSignal.timeout(timeoutMs),
  });
  // Drain the body so the connection can be reused.
  const text = await response.text();
  if (!response.ok) throw new Error(`response URL answered HTTP ${response.status}${text ? `: ${text.slice(0, 200)}` : ''}`);
}
