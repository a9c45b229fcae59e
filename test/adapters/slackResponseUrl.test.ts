import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { postToResponseUrl } from '../../adapters/answering/slackResponseUrl.ts';
import { RecordingServer } from './recordingServer.ts';

// A response URL on a local stand-in: /gone answers as an expired URL does, /slow too late.
const responseUrls = new RecordingServer(async (call) => {
  if (call.path === '/gone') return { status: 404, body: 'expired_url' };
  if (call.path === '/slow') await new Promise((resolve) => setTimeout(resolve, 2_000).unref());
  return { status: 200, body: 'ok' };
});
let base: string;
const received = () => responseUrls.callsTo(/^\/ok$/).map((call) => [call.headers['content-type'], call.body]);

beforeAll(async () => {
  base = (await responseUrls.start()).origin;
});
afterAll(() => responseUrls.stop());

describe('posting to a Slack response URL', () => {
  it('sends the message as JSON', async () => {
    await postToResponseUrl(`${base}/ok`, { response_type: 'in_channel', text: 'Mixing reaches the dry layer (invented)' }, 5_000);
    expect(received().at(-1)).toEqual(['application/json; charset=utf-8', { response_type: 'in_channel', text: 'Mixing reaches the dry layer (invented)' }]);
  });

  it('fails with the status and what Slack said, or with the deadline it missed', async () => {
    await expect(postToResponseUrl(`${base}/gone`, { text: 'x' }, 5_000)).rejects.toThrow('response URL answered HTTP 404: expired_url');
    await expect(postToResponseUrl(`${base}/slow`, { text: 'x' }, 50)).rejects.toThrow('response URL did not answer within 50 ms');
  });
});
