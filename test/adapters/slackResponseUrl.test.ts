import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { postToResponseUrl } from '../../adapters/answering/slackResponseUrl.ts';

let server: Server;
let base: string;
const received: unknown[] = [];

beforeAll(async () => {
  server = createServer((request, response) => {
    const chunks: Buffer[] = [];
    request.on('data', (chunk: Buffer) => chunks.push(chunk));
    request.on('end', () => {
      if (request.url === '/gone') return void response.writeHead(404).end('expired_url');
      if (request.url === '/slow') return void setTimeout(() => response.end('ok'), 2_000).unref();
      received.push([request.headers['content-type'], JSON.parse(Buffer.concat(chunks).toString('utf8'))]);
      response.end('ok');
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

describe('posting to a Slack response URL', () => {
  it('sends the message as JSON', async () => {
    await postToResponseUrl(`${base}/ok`, { response_type: 'in_channel', text: 'Mixing reaches the dry layer (invented)' }, 5_000);
    expect(received.at(-1)).toEqual(['application/json; charset=utf-8', { response_type: 'in_channel', text: 'Mixing reaches the dry layer (invented)' }]);
  });

  it('fails with the status and what Slack said, or with the deadline it missed', async () => {
    await expect(postToResponseUrl(`${base}/gone`, { text: 'x' }, 5_000)).rejects.toThrow('response URL answered HTTP 404: expired_url');
    await expect(postToResponseUrl(`${base}/slow`, { text: 'x' }, 50)).rejects.toThrow('response URL did not answer within 50 ms');
  });
});
