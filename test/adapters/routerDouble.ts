// A test double of the CommandRouter interface (not the real router): it answers fixed messages and
// records what the adapters handed it, so the tests can check the adapters, which are under test.
import type { ActionRequest, CommandRequest, CommandRouter } from '../../src/router/routerTypes.ts';
import type { Message } from '../../src/render/message.ts';
import { buildMessage } from '../../src/render/safetyFooter.ts';

/** A 1x1 transparent PNG: enough bytes for the upload paths to carry. */
export const tinyPng = Uint8Array.from(
  Buffer.from(
    'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
    'base64',
  ),
);

/** A lookup for an invented place, with a button and (optionally) an image. */
export function fixedLookup(text: string, withImage: boolean): Message {
  return buildMessage({
    kind: 'lookup',
    title: `Invented place "Cinder Flats" (test double answering "${text}")`,
    inventedData: true,
    sections: [
      {
        heading: 'Next 48 hours (invented)',
        lines: ['Mixed layer reaches the dry layer aloft at 14:00 local.'],
        fields: [{ label: 'Peak mixing height', value: '3,200 m AGL' }],
      },
    ],
    actions: [
      { actionId: 'show-detail', label: 'Detail 14:00', value: 'detail:cinder-flats:14' },
      { actionId: 'mute-rule', label: 'Mute 6 h', value: 'mute:coupling:cinder-flats' },
    ],
    images: withImage ? [{ fileName: 'mixing-48h.png', altText: 'Mixing height, 48 h (invented)', png: tinyPng }] : [],
  });
}

/** What the real router answers to a watch: a confirmation that turned on posts to the channel. */
export function fixedWatchConfirmation(text: string): Message {
  return { ...buildMessage({ kind: 'notice', title: `Watching "Cinder Flats" (test double answering "${text}"): alerts on.` }), postsToChannel: true };
}

export interface RouterDoubleOptions {
  /** Attach a PNG to lookups. */
  withImage?: boolean;
  /** Milliseconds each answer takes, to show the acknowledgement does not wait for it. */
  delayMs?: number;
  /** Throw instead of answering, to show the adapter survives a broken router. */
  throws?: boolean;
}

export class RouterDouble implements CommandRouter {
  readonly commands: CommandRequest[] = [];
  readonly actions: ActionRequest[] = [];
  private readonly waiters: Array<() => void> = [];
  private gate: Promise<void> | undefined;
  private openGate: (() => void) | undefined;

  constructor(private readonly options: RouterDoubleOptions = {}) {}

  async handleCommand(request: CommandRequest): Promise<Message> {
    this.commands.push(request);
    this.notify();
    await this.pause();
    if (this.options.throws) throw new Error('router double told to throw');
    if (request.text.startsWith('watch ')) return fixedWatchConfirmation(request.text);
    return fixedLookup(request.text, this.options.withImage ?? false);
  }

  async handleAction(request: ActionRequest): Promise<Message> {
    this.actions.push(request);
    this.notify();
    await this.pause();
    return buildMessage({
      kind: 'notice',
      title: `Test double: ${request.actionId} received (${request.value})`,
      inventedData: true,
    });
  }

  /** Resolves when the router has received `count` requests in all. */
  async received(count: number, timeoutMs = 5_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    while (this.commands.length + this.actions.length < count) {
      const left = deadline - Date.now();
      if (left <= 0) throw new Error(`router double received ${this.commands.length + this.actions.length} of ${count}`);
      await new Promise<void>((resolve) => {
        const timer = setTimeout(resolve, Math.min(left, 100));
        this.waiters.push(() => {
          clearTimeout(timer);
          resolve();
        });
      });
    }
  }

  private notify(): void {
    for (const wake of this.waiters.splice(0)) wake();
  }

  /** Answers wait until `release()`: proves an acknowledgement did not wait for the answer. */
  hold(): void {
    this.gate = new Promise((resolve) => (this.openGate = resolve));
  }

  release(): void {
    this.openGate?.();
    this.gate = undefined;
  }

  private async pause(): Promise<void> {
    if (this.gate) await this.gate;
    if (this.options.delayMs) await new Promise((resolve) => setTimeout(resolve, this.options.delayMs));
  }
}
