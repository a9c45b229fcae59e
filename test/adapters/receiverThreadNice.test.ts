// The receiver thread's priority when the answering thread lowers its own (npm start's
// ANSWER_THREAD_NICE): the first receiver thread starts before the lowering; one restarted after a
// crash inherits the lowered priority and must go back to the receivers' own (or say it could not).
import { getPriority } from 'node:os';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LogLevel } from '@slack/bolt';
import { startReceiverThread, type RunningReceiverThread } from '../../adapters/receiverThread/startReceiverThread.ts';
import { RouterDouble } from './routerDouble.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';

describe('receiver thread priority', () => {
  let slackStandIn: SlackStandIn;
  let receivers: RunningReceiverThread;
  const logged: string[] = [];
  const niceAtStart = getPriority(0);

  beforeAll(async () => {
    slackStandIn = await startSlackStandIn();
    receivers = await startReceiverThread({
      router: new RouterDouble(),
      slack: { botToken: 'xoxb-invented', signingSecret: 'invented-signing-secret', apiUrl: slackStandIn.apiUrl, port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR },
      answerThreadNice: niceAtStart + 10,
      log: (level, text) => logged.push(`${level}: ${text}`),
    });
  });

  afterAll(async () => {
    await receivers?.stop();
    await slackStandIn?.stop();
  });

  it('runs the first receiver thread at the priority the process had, the answering thread lower', () => {
    expect(receivers.receiverNice).toBe(niceAtStart);
    expect(getPriority(0)).toBe(Math.min(niceAtStart + 10, 19));
  });

  it('brings a receiver thread restarted after a crash back to that priority, or says why it cannot', async () => {
    const before = receivers.currentWorker();
    await before.terminate();
    const deadline = Date.now() + 20_000;
    while ((receivers.currentWorker() === before || !logged.some((line) => line.includes('restarted'))) && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect(receivers.restarts()).toBe(1);
    const couldNot = logged.find((line) => line.includes('chat receiver thread runs at nice'));
    if (couldNot) expect(receivers.receiverNice).toBe(Math.min(niceAtStart + 10, 19));
    else expect(receivers.receiverNice).toBe(niceAtStart);
  });
});
