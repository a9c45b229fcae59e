import { WebClient } from '@slack/web-api';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { answerClientOptions } from '../../adapters/slack/slackClientOptions.ts';
import { uploadSlackImages } from '../../adapters/slack/uploadSlackImages.ts';
import type { RecordedCall } from './recordingServer.ts';
import { tinyPng } from './routerDouble.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';

// The reference is @slack/web-api's own filesUploadV2: our upload must make the same calls, with
// the same fields, against the same stand-in (which parses multipart bodies here).
let standIn: SlackStandIn;
let client: WebClient;

beforeAll(async () => {
  standIn = await startSlackStandIn();
  client = new WebClient('xoxb-invented', answerClientOptions(standIn.apiUrl));
});
afterAll(() => standIn?.stop());

/** The calls of one upload, without what differs by nature (file ids, boundaries, token). */
function shapeOf(calls: RecordedCall[]): unknown[] {
  return calls.map((call) => {
    if (call.path.startsWith('/upload/')) return ['upload', call.method, call.body];
    const { token: _token, ...fields } = call.body as Record<string, string>;
    if (typeof fields.files === 'string') fields.files = JSON.stringify((JSON.parse(fields.files) as Array<{ id: string; title: string }>).map(({ title }) => ({ title })));
    return [call.path, call.method, fields];
  });
}

describe('picture upload to Slack', () => {
  const files = [
    { fileName: 'mixing-48h.png', title: 'Mixing height, 48 h (invented)', altText: 'Mixing height chart (invented data)', png: tinyPng },
    { fileName: 'skew-t.png', title: 'Skew-T (invented)', altText: 'Skew-T diagram (invented data)', png: tinyPng.slice() },
  ];

  it('makes the same calls with the same fields as the library\'s filesUploadV2', async () => {
    const start = standIn.calls.length;
    await client.filesUploadV2({
      channel_id: 'C0INVENTED',
      file_uploads: files.map((file) => ({ file: Buffer.from(file.png), filename: file.fileName, title: file.title, alt_text: file.altText })),
    });
    const theirs = standIn.calls.slice(start);
    const middle = standIn.calls.length;
    expect(await uploadSlackImages(client, 'C0INVENTED', files)).toEqual({ ok: true });
    const ours = standIn.calls.slice(middle);
    // Two upload URLs, two uploads, one completion sharing both files.
    expect(ours).toHaveLength(5);
    expect(shapeOf(ours)).toEqual(shapeOf(theirs));
    const upload = ours.find((call) => call.path.startsWith('/upload/'))!;
    expect(upload.body).toEqual({ body: { fileName: 'Untitled', size: tinyPng.byteLength, type: 'application/octet-stream' } });
  });

  it('reports a failed upload as a reason, not a throw', async () => {
    standIn.failMethod('files.getUploadURLExternal', 'invalid_auth', 1);
    const result = await uploadSlackImages(client, 'C0INVENTED', files.slice(0, 1));
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.reason).toMatch(/invalid_auth/);
  });
});
