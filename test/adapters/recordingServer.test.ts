// The stand-ins' recording server tells a benchmark when a request's head arrived, before it has
// read, recorded and answered it: acknowledgements are timed there (bench/chatLoadProcess.ts).
import { afterEach, describe, expect, it } from 'vitest';
import { nodeHttpFetch } from '../../adapters/http/nodeHttpFetch.ts';
import { RecordingServer, type Reply } from './recordingServer.ts';

describe('RecordingServer.onArrival', () => {
  let server: RecordingServer | undefined;
  afterEach(async () => {
    await server?.stop();
  });

  it('is told of a request, with its query, while the handler has not answered it yet', async () => {
    let release!: (reply: Reply) => void;
    server = await new RecordingServer(() => new Promise<Reply>((resolve) => (release = resolve))).start();
    const events: string[] = [];
    server.onArrival((method, url) => events.push(`arrived ${method} ${url}`));
    server.onCall((call) => events.push(`recorded ${call.path}`));

    const answered = nodeHttpFetch(`${server.origin}/api/v10/interactions/1/tok/callback?with_response=false`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"type":5}' });
    await expect.poll(() => events.length).toBe(1);
    expect(events).toEqual(['arrived POST /api/v10/interactions/1/tok/callback?with_response=false']);

    release({ status: 204 });
    expect((await answered).status).toBe(204);
    expect(events).toEqual(['arrived POST /api/v10/interactions/1/tok/callback?with_response=false', 'recorded /api/v10/interactions/1/tok/callback']);
  });
});
