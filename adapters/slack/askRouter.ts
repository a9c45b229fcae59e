import type { Message } from '../../src/render/message.ts';
import { buildMessage } from '../../src/render/safetyFooter.ts';

/**
 * The router promises never to throw; if it breaks that promise the user still gets an answer
 * (and the footer) instead of silence, and the process keeps running.
 */
export async function askRouter(call: () => Promise<Message>, onError: (error: unknown) => void): Promise<Message> {
  try {
    return await call();
  } catch (error) {
    onError(error);
    return buildMessage({
      kind: 'error',
      title: 'Lapsewatch could not answer that just now. Nothing was changed; please try again in a minute.',
    });
  }
}
