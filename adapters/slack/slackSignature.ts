import { createHmac } from 'node:crypto';

/**
 * Slack's request signature, version 0: "v0=" and the hex HMAC-SHA256, keyed with the signing
 * secret, of "v0:{timestamp in seconds}:{raw body}". Bolt checks it on every request; the receiver
 * makes them only for the requests it sends itself at start (warmUpSlackReceiver.ts).
 */
export function slackSignatureV0(signingSecret: string, timestampSec: number, body: string): string {
  return `v0=${createHmac('sha256', signingSecret).update(`v0:${timestampSec}:${body}`).digest('hex')}`;
}

/** The headers Slack sends with a signed form body (commands and button presses), as Bolt checks them. */
export function slackSignedFormHeaders(signingSecret: string, body: string, timestampSec: number = Math.floor(Date.now() / 1000)): Record<string, string> {
  return {
    'content-type': 'application/x-www-form-urlencoded',
    'x-slack-request-timestamp': String(timestampSec),
    'x-slack-signature': slackSignatureV0(signingSecret, timestampSec, body),
  };
}
