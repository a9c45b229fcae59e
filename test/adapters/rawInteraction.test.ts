// The gateway payload reader's warm-up: it must run the reader's whole path (commands and button
// presses read as ours), or it warms nothing. The reader itself is tested at the wire through the
// real discord.js client in discordGateway.test.ts.
import { describe, expect, it } from 'vitest';
import { RAW_INTERACTION_WARM_UP_ROUNDS, readRawInteraction, warmUpRawInteractionReader } from '../../adapters/discord/rawInteraction.ts';

const ours = { applicationId: '1100000000000000001', commandName: 'invented-command' };

describe('raw interaction reader warm-up', () => {
  it('reads every one of its invented payloads as ours, commands and buttons alike', () => {
    expect(warmUpRawInteractionReader(ours)).toBe(RAW_INTERACTION_WARM_UP_ROUNDS);
    expect(warmUpRawInteractionReader(ours, 2)).toBe(2);
  });

  it('leaves the reader as it was: another application is still not ours', () => {
    warmUpRawInteractionReader(ours, 4);
    const foreign = { id: '1', token: 't', application_id: '1100000000000000099', type: 2, channel_id: '2', data: { name: ours.commandName, type: 1 } };
    expect(readRawInteraction(foreign, ours)).toBeNull();
    expect(readRawInteraction({ ...foreign, application_id: ours.applicationId }, ours)).toMatchObject({ id: '1', ask: { kind: 'command', request: { text: '' } } });
  });
});
