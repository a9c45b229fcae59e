import { request as httpRequest } from 'node:http';
import { request as httpsRequest } from 'node:https';

/**
 * Posts a reply to a Slack response URL (a plain HTTPS POST of the message JSON, no token). Plain
 * node:http(s) rather than fetch: it costs the answering thread a fraction of fetch's CPU per call,
 * and every command makes one. An answer that cannot be delivered in `timeoutMs` is a failure the
 * caller logs: it is late anyway.
 */
export function postToResponseUrl(responseUrl: string, body: Record<string, unknown>, timeoutMs: number): Promise<void> {
  const url = new URL(responseUrl);
  const payload = Buffer.from(JSON.stringify(body), 'utf8');
  const send = url.protocol === 'http:' ? httpRequest : httpsRequest;
  return new Promise((resolve, reject) => {
    const outgoing = send(url, { method: 'POST', headers: { 'content-type': 'application/json; charset=utf-8', 'content-length': payload.length }, timeout: timeoutMs }, (response) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => {
        const status = response.statusCode ?? 0;
        if (status >= 200 && status < 300) resolve();
        else reject(new Error(`response URL answered HTTP ${status}${chunks.length > 0 ? `: ${Buffer.concat(chunks).toString('utf8').slice(0, 200)}` : ''}`));
      });
      response.on('error', reject);
    });
    outgoing.on('timeout', () => outgoing.destroy(new Error(`response URL did not answer within ${timeoutMs} ms`)));
    outgoing.on('error', reject);
    outgoing.end(payload);
  });
}
