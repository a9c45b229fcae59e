// The multipart body for Discord messages with pictures, read back with undici's FormData parser
// (Node's Response.formData), an implementation of the multipart/form-data format (RFC 7578) that
// is not ours.
import { describe, expect, it } from 'vitest';
import { discordSendData } from '../../adapters/discord/discordSendData.ts';

const png = Uint8Array.from({ length: 5000 }, (_, index) => (index * 37) % 256);
const chart = { fileName: 'mixing-48h.png', altText: 'Invented chart', png };
const body = { content: 'Invented answer', attachments: [{ id: 0, filename: 'mixing-48h.png', description: 'Invented chart' }] };

/** The form as undici reads it, from the pieces the transport writes one after another. */
async function readForm(data: ReturnType<typeof discordSendData>): Promise<FormData> {
  const headers = data.headers as Record<string, string>;
  expect(Array.isArray(data.body)).toBe(true);
  return new Response(Buffer.concat(data.body as Buffer[]), { headers: { 'content-type': headers['Content-Type']! } }).formData();
}

describe('discordSendData', () => {
  it('sends a body without pictures as JSON through the library', () => {
    expect(discordSendData(body, [])).toEqual({ body });
  });

  it('puts each picture in files[n] and the JSON in payload_json, passed through unchanged', async () => {
    const data = discordSendData(body, [chart, { ...chart, fileName: 'skew-t.png' }]);
    expect(data.passThroughBody).toBe(true);
    const form = await readForm(data);
    const first = form.get('files[0]') as File;
    expect(first.name).toBe('mixing-48h.png');
    expect(first.type).toBe('image/png');
    expect(new Uint8Array(await first.arrayBuffer())).toEqual(png);
    expect((form.get('files[1]') as File).name).toBe('skew-t.png');
    expect(JSON.parse(form.get('payload_json') as string)).toEqual(body);
  });

  it('keeps the picture bytes when they hold what looks like a form boundary', async () => {
    const tricky = new TextEncoder().encode('\r\n--lapsewatch-0000\r\nContent-Disposition: form-data; name="x"\r\n\r\n');
    const form = await readForm(discordSendData(body, [{ ...chart, png: tricky }]));
    expect(new Uint8Array(await (form.get('files[0]') as File).arrayBuffer())).toEqual(tricky);
  });
});
