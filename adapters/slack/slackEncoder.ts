import type { Message } from '../../src/render/message.ts';
import { encodeForSlack, type SlackEncoding } from '../../src/render/encodeSlack.ts';

/** What the Slack adapter needs from the renderer: blocks, a plain-text fallback and the images. */
export type SlackEncoder = (message: Message) => SlackEncoding;

export const defaultSlackEncoder: SlackEncoder = encodeForSlack;
