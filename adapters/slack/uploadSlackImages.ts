import type { WebClient } from '@slack/web-api';
import type { SlackFile } from '../../src/render/encodeSlack.ts';
import { multipartBody } from '../http/multipartBody.ts';
import { nodeHttpFetch } from '../http/nodeHttpFetch.ts';
import { slackPostOutcome } from './slackPostOutcome.ts';

/** `channelGone`: Slack refused because the bot cannot post in the channel (not a member, archived...). */
export type UploadResult = { ok: true } | { ok: false; reason: string; channelGone: boolean };

/**
 * The bytes POSTed to Slack's upload URL: one multipart part named "body" with the file name
 * "Untitled", as @slack/web-api's filesUploadV2 sends them. Built directly rather than through
 * FormData and Blob, which copied a 50-200 kB PNG three times and cost about 1.3 ms of the
 * answering thread per picture. Sent as its pieces (the transport writes them in turn), the PNG is
 * not copied at all.
 */
function uploadForm(png: Uint8Array): { body: Buffer[]; contentType: string } {
  const form = multipartBody([{ name: 'body', fileName: 'Untitled', contentType: 'application/octet-stream', bytes: png }]);
  return { body: form.pieces, contentType: form.contentType };
}

/** Steps one and two for one file: an upload URL, then the bytes; returns the file's id. */
async function stageOne(client: WebClient, file: SlackFile, timeoutMs: number): Promise<{ id: string; title: string }> {
  const target = await client.files.getUploadURLExternal({ filename: file.fileName, length: file.png.byteLength, alt_text: file.altText });
  if (!target.upload_url || !target.file_id) throw new Error('files.getUploadURLExternal gave no upload URL');
  const { body, contentType } = uploadForm(file.png);
  const sent = await nodeHttpFetch(target.upload_url, { method: 'POST', headers: { 'content-type': contentType }, body, signal: AbortSignal.timeout(timeoutMs) });
  if (sent.status !== 200) throw new Error(`Failed to upload file (id: ${target.file_id}, filename: ${file.fileName}): HTTP ${sent.status}`);
  return { id: target.file_id, title: file.title };
}

/**
 * PNGs go up through Slack's external upload flow, the steps `filesUploadV2` runs:
 * files.getUploadURLExternal and files.completeUploadExternal through the Web API client (its
 * retries and rate-limit handling), and between them a POST of the bytes to the upload URL.
 * A failed upload is reported, not thrown: the text answer has already been given and stands on
 * its own.
 */
export async function uploadSlackImages(client: WebClient, channelId: string, files: SlackFile[], threadTs?: string, timeoutMs = 10_000): Promise<UploadResult> {
  try {
    if (files.length === 0) return { ok: true };
    const staged = await Promise.all(files.map((file) => stageOne(client, file, timeoutMs)));
    // One completion shares all the files in one message, as filesUploadV2 does.
    await client.files.completeUploadExternal({ files: staged as [{ id: string; title: string }], channel_id: channelId, ...(threadTs ? { thread_ts: threadTs } : {}) });
    return { ok: true };
  } catch (error) {
    const outcome = slackPostOutcome(error);
    return { ok: false, reason: outcome.kind === 'channel-gone' ? outcome.reason : error instanceof Error ? error.message : String(error), channelGone: outcome.kind === 'channel-gone' };
  }
}
