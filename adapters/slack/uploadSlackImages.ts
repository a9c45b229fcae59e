import type { WebClient } from '@slack/web-api';
import type { SlackFile } from '../../src/render/encodeSlack.ts';
import { bufferView } from '../http/bufferView.ts';

export type UploadResult = { ok: true } | { ok: false; reason: string };

/**
 * PNGs go up through Slack's external upload flow (files.getUploadURLExternal, a POST of the
 * bytes, files.completeUploadExternal), which `filesUploadV2` runs for us. A failed upload is
 * reported, not thrown: the text answer has already been given and stands on its own.
 */
export async function uploadSlackImages(client: WebClient, channelId: string, files: SlackFile[], threadTs?: string): Promise<UploadResult> {
  if (files.length === 0) return { ok: true };
  try {
    await client.filesUploadV2({
      channel_id: channelId,
      ...(threadTs ? { thread_ts: threadTs } : {}),
      file_uploads: files.map((file) => ({
        file: bufferView(file.png),
        filename: file.fileName,
        title: file.title,
        alt_text: file.altText,
      })),
    });
    return { ok: true };
  } catch (error) {
    return { ok: false, reason: error instanceof Error ? error.message : String(error) };
  }
}
