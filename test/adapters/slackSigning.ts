// Builds requests the way Slack signs them (v0: HMAC-SHA256 of "v0:{timestamp}:{body}"). Bolt's
// own verification is what the tests hold these signatures to.
import { nodeHttpFetch } from '../../adapters/http/nodeHttpFetch.ts';
import { slackSignedFormHeaders } from '../../adapters/slack/slackSignature.ts';

export interface SignedPostOptions {
  secret: string;
  /** Defaults to now. */
  timestampSec?: number;
  /** Replace the signature (to send a wrong one). */
  signature?: string;
}

/** The headers Slack sends with a signed form body. */
export function signedFormHeaders(body: string, options: SignedPostOptions): Record<string, string> {
  const headers = slackSignedFormHeaders(options.secret, body, options.timestampSec);
  return options.signature === undefined ? headers : { ...headers, 'x-slack-signature': options.signature };
}

/** POSTs a form body to the receiver, signed; resolves with the HTTP status and body. */
export async function postSigned(url: string, form: Record<string, string>, options: SignedPostOptions): Promise<{ status: number; text: string }> {
  const body = new URLSearchParams(form).toString();
  const response = await nodeHttpFetch(url, { method: 'POST', headers: signedFormHeaders(body, options), body });
  return { status: response.status, text: await response.text() };
}

/** The form Slack posts for a slash command. */
export function slashCommandForm(command: string, text: string, responseUrl: string, channelId = 'C0INVENTED'): Record<string, string> {
  return {
    token: 'legacy-verification-token-unused',
    team_id: 'T0INVENTED',
    team_domain: 'invented',
    channel_id: channelId,
    channel_name: 'invented-incident',
    user_id: 'U0CREWLEAD',
    user_name: 'crewlead',
    command,
    text,
    api_app_id: 'A0LAPSE',
    response_url: responseUrl,
    trigger_id: '1.2.3',
  };
}

/** The payload Slack posts (as `payload=`) when a Block Kit button is pressed. */
export function buttonPayload(actionId: string, value: string, responseUrl: string): object {
  return {
    type: 'block_actions',
    team: { id: 'T0INVENTED', domain: 'invented' },
    user: { id: 'U0CREWLEAD', username: 'crewlead', team_id: 'T0INVENTED' },
    api_app_id: 'A0LAPSE',
    token: 'legacy-verification-token-unused',
    container: { type: 'message', message_ts: '1700000000.000001', channel_id: 'C0INVENTED', is_ephemeral: false },
    trigger_id: '1.2.4',
    channel: { id: 'C0INVENTED', name: 'invented-incident' },
    response_url: responseUrl,
    actions: [{ type: 'button', action_id: actionId, block_id: 'b1', value, text: { type: 'plain_text', text: 'Detail' }, action_ts: '1700000001.000000' }],
  };
}
