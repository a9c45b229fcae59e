// A stand-in for Discord on 127.0.0.1: the REST API under /api/v10 and a gateway WebSocket
// (/gateway) that says HELLO, takes IDENTIFY, sends READY, answers heartbeats and then sends
// whatever dispatches a test asks for. Reusable by the delivery tests: faults via addFault
// (429 with Retry-After and retry_after, 500 for a while), unknown channels via goneChannels,
// and the nonce window of POST /channels/{id}/messages emulated (enforce_nonce returns the first).
import { WebSocketServer, type WebSocket } from 'ws';
import { RecordingServer, type RecordedCall, type Reply } from './recordingServer.ts';

export const standInApplicationId = '1100000000000000001';
export const standInBotUserId = '1100000000000000002';
export const standInGuildId = '1100000000000000003';
export const standInChannelId = '1100000000000000004';

const botUser = { id: standInBotUserId, username: 'lapsewatch', discriminator: '0', global_name: null, avatar: null, bot: true };

/** Manage Channels is bit 4. */
export const MANAGE_CHANNELS = 1n << 4n;
export const SEND_MESSAGES = 1n << 11n;
/** What the app itself may do in the stand-in's channel by default: view, send, embed links, attach files. */
export const APP_CAN_POST = (1n << 10n) | SEND_MESSAGES | (1n << 14n) | (1n << 15n);

export interface GatewayFrame {
  op: number;
  d: any;
  s?: number | null;
  t?: string | null;
}

let snowflakeCounter = 0n;
/** Ids that read as real snowflakes (discord.js derives timestamps from them). */
export function nextSnowflake(): string {
  snowflakeCounter += 1n;
  return String((BigInt(Date.now() - 1420070400000) << 22n) + snowflakeCounter);
}

export class DiscordStandIn extends RecordingServer {
  /** Channels that answer 10003 Unknown Channel. */
  readonly goneChannels = new Set<string>();
  /** Channels that answer 50001 Missing Access. */
  readonly forbiddenChannels = new Set<string>();
  /** Frames the bot sent on the gateway. */
  readonly gatewayFrames: GatewayFrame[] = [];
  heartbeatIntervalMs = 41_250;
  private readonly nonces = new Map<string, object>();
  private readonly wss: WebSocketServer;
  private readonly gatewaySockets: WebSocket[] = [];
  private sequence = 0;
  private identifyWaiters: Array<() => void> = [];

  constructor() {
    super((call) => this.answer(call));
    this.wss = new WebSocketServer({ server: this.server, path: '/gateway' });
    this.wss.on('connection', (socket) => this.greet(socket));
  }

  /** REST base for discord.js (`rest.api`) and DISCORD_API_URL. */
  get apiUrl(): string {
    return `${this.origin}/api`;
  }

  /** Resolves once a client has identified and been sent READY. */
  async identified(timeoutMs = 10_000): Promise<void> {
    if (this.gatewayFrames.some((frame) => frame.op === 2)) return;
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error('no IDENTIFY on the gateway')), timeoutMs);
      this.identifyWaiters.push(() => {
        clearTimeout(timer);
        resolve();
      });
    });
  }

  /** Sends a dispatch (op 0) to every connected client. */
  dispatch(type: string, data: object): void {
    this.sequence += 1;
    const frame = JSON.stringify({ op: 0, t: type, s: this.sequence, d: data });
    for (const socket of this.gatewaySockets) socket.send(frame);
  }

  /**
   * A GUILD_CREATE for the stand-in's guild with its text channel and one thread under it, as
   * Discord sends it to a client with the Guilds intent; returns the thread's id.
   */
  sendGuildWithThread(): string {
    const threadId = '1100000000000000044';
    const channel = { id: standInChannelId, type: 0, guild_id: standInGuildId, name: 'invented-incident', position: 0, permission_overwrites: [], parent_id: null };
    const thread = {
      id: threadId,
      type: 11,
      guild_id: standInGuildId,
      parent_id: standInChannelId,
      name: 'cinder-flats-ops (invented)',
      owner_id: '1100000000000000005',
      message_count: 0,
      member_count: 1,
      thread_metadata: { archived: false, auto_archive_duration: 1440, archive_timestamp: new Date(0).toISOString(), locked: false },
    };
    this.dispatch('GUILD_CREATE', {
      id: standInGuildId,
      name: 'Invented fire district',
      icon: null,
      owner_id: '1100000000000000005',
      unavailable: false,
      roles: [],
      emojis: [],
      features: [],
      members: [],
      channels: [channel],
      threads: [thread],
    });
    return threadId;
  }

  /** An INTERACTION_CREATE for our slash command, as a member with the given permissions (and the app with its own). */
  sendCommand(
    commandName: string,
    text: string | undefined,
    permissions: bigint = MANAGE_CHANNELS | SEND_MESSAGES,
    appPermissions: bigint = APP_CAN_POST,
    channel: { id: string; type: number } = { id: standInChannelId, type: 0 },
  ): { id: string; token: string } {
    return this.sendAlteredCommand(commandName, text, {}, permissions, appPermissions, channel);
  }

  /** As sendCommand, with top-level fields replaced, or removed where `alter` gives undefined: payloads that are not ours or not whole. */
  sendAlteredCommand(
    commandName: string,
    text: string | undefined,
    alter: Record<string, unknown>,
    permissions: bigint = MANAGE_CHANNELS | SEND_MESSAGES,
    appPermissions: bigint = APP_CAN_POST,
    channel: { id: string; type: number } = { id: standInChannelId, type: 0 },
  ): { id: string; token: string } {
    const id = nextSnowflake();
    const token = `itoken-${id}`;
    const payload: Record<string, unknown> = {
      ...this.interactionBase(id, token, permissions, appPermissions, channel),
      type: 2,
      data: {
        id: '1100000000000000009',
        name: commandName,
        type: 1,
        ...(text !== undefined ? { options: [{ name: 'text', type: 3, value: text }] } : {}),
      },
    };
    for (const [field, value] of Object.entries(alter)) {
      if (value === undefined) delete payload[field];
      else payload[field] = value;
    }
    this.dispatch('INTERACTION_CREATE', payload);
    return { id, token };
  }

  /** An INTERACTION_CREATE for a button press on one of our messages (the app with its own permissions). */
  sendButton(customId: string, permissions: bigint = SEND_MESSAGES, appPermissions: bigint = APP_CAN_POST): { id: string; token: string } {
    const id = nextSnowflake();
    const token = `itoken-${id}`;
    this.dispatch('INTERACTION_CREATE', {
      ...this.interactionBase(id, token, permissions, appPermissions, { id: standInChannelId, type: 0 }),
      type: 3,
      data: { custom_id: customId, component_type: 2 },
      message: this.messageObject(standInChannelId, { content: 'earlier answer' }),
    });
    return { id, token };
  }

  callbackOf(interactionId: string): RecordedCall | undefined {
    return this.calls.find((call) => call.path.startsWith(`/api/v10/interactions/${interactionId}/`));
  }

  /** The JSON of a request whether sent plain or as multipart payload_json; {} for a body left unparsed (skipMultipartBodies). */
  static payloadOf(call: RecordedCall): any {
    return typeof call.body?.payload_json === 'string' ? JSON.parse(call.body.payload_json) : (call.body ?? {});
  }

  override async stop(): Promise<void> {
    for (const socket of this.gatewaySockets) socket.terminate();
    await new Promise<void>((resolve) => this.wss.close(() => resolve()));
    await super.stop();
  }

  private interactionBase(id: string, token: string, permissions: bigint, appPermissions: bigint, channel: { id: string; type: number }): object {
    return {
      id,
      token,
      application_id: standInApplicationId,
      version: 1,
      guild_id: standInGuildId,
      channel_id: channel.id,
      channel: { id: channel.id, type: channel.type, guild_id: standInGuildId, name: 'invented-incident', permissions: String(permissions) },
      member: {
        user: { id: '1100000000000000005', username: 'crewlead', discriminator: '0', global_name: 'Crew Lead (invented)', avatar: null },
        roles: [],
        joined_at: new Date(0).toISOString(),
        deaf: false,
        mute: false,
        flags: 0,
        permissions: String(permissions),
      },
      app_permissions: String(appPermissions),
      locale: 'en-US',
      guild_locale: 'en-US',
      entitlements: [],
      authorizing_integration_owners: { '0': standInGuildId },
      context: 0,
    };
  }

  private messageObject(channelId: string, fields: Record<string, unknown>): object {
    return {
      id: nextSnowflake(),
      channel_id: channelId,
      author: botUser,
      content: '',
      timestamp: new Date().toISOString(),
      edited_timestamp: null,
      tts: false,
      mention_everyone: false,
      mentions: [],
      mention_roles: [],
      attachments: [],
      embeds: [],
      components: [],
      pinned: false,
      type: 0,
      ...fields,
    };
  }

  private greet(socket: WebSocket): void {
    this.gatewaySockets.push(socket);
    socket.on('message', (data) => {
      const frame = JSON.parse(data.toString()) as GatewayFrame;
      this.gatewayFrames.push(frame);
      if (frame.op === 1) socket.send(JSON.stringify({ op: 11, d: null }));
      if (frame.op === 2) {
        this.sequence += 1;
        socket.send(
          JSON.stringify({
            op: 0,
            t: 'READY',
            s: this.sequence,
            d: {
              v: 10,
              user: botUser,
              guilds: [],
              session_id: `session-${Date.now()}`,
              resume_gateway_url: `${this.wsOrigin}/gateway`,
              shard: [0, 1],
              application: { id: standInApplicationId, flags: 0 },
            },
          }),
        );
        for (const wake of this.identifyWaiters.splice(0)) wake();
      }
    });
    socket.send(JSON.stringify({ op: 10, d: { heartbeat_interval: this.heartbeatIntervalMs } }));
  }

  private answer(call: RecordedCall): Reply {
    const path = call.path.replace(/^\/api\/v\d+/, '');
    if (call.method === 'GET' && path === '/gateway/bot') {
      return {
        status: 200,
        body: { url: `${this.wsOrigin}/gateway`, shards: 1, session_start_limit: { total: 1000, remaining: 1000, reset_after: 0, max_concurrency: 1 } },
      };
    }
    if (call.method === 'POST' && /^\/interactions\/\d+\/[^/]+\/callback$/.test(path)) return { status: 204 };
    const webhook = /^\/webhooks\/(\d+)\/([^/]+)\/messages\/@original$/.exec(path);
    if (webhook && call.method === 'PATCH') {
      const payload = DiscordStandIn.payloadOf(call);
      return { status: 200, body: this.messageObject(standInChannelId, { content: payload.content ?? '', embeds: payload.embeds ?? [], components: payload.components ?? [], webhook_id: webhook[1] }) };
    }
    const channelPost = /^\/channels\/(\d+)\/messages$/.exec(path);
    if (channelPost && call.method === 'POST') return this.channelMessage(channelPost[1]!, call);
    if (call.method === 'PUT' && /^\/applications\/\d+(\/guilds\/\d+)?\/commands$/.test(path)) {
      return { status: 200, body: (call.body as object[]).map((command) => ({ ...command, id: nextSnowflake(), application_id: standInApplicationId, version: '1' })) };
    }
    return { status: 404, body: { message: '404: Not Found', code: 0 } };
  }

  private channelMessage(channelId: string, call: RecordedCall): Reply {
    if (this.goneChannels.has(channelId)) return { status: 404, body: { message: 'Unknown Channel', code: 10003 } };
    if (this.forbiddenChannels.has(channelId)) return { status: 403, body: { message: 'Missing Access', code: 50001 } };
    const payload = DiscordStandIn.payloadOf(call);
    if (typeof payload.content === 'string' && payload.content.length > 2000) {
      return { status: 400, body: { message: 'Invalid Form Body', code: 50035, errors: { content: { _errors: [{ code: 'BASE_TYPE_MAX_LENGTH', message: 'Must be 2000 or fewer in length.' }] } } } };
    }
    const nonceKey = payload.enforce_nonce && payload.nonce !== undefined ? `${channelId}:${payload.nonce}` : undefined;
    const earlier = nonceKey ? this.nonces.get(nonceKey) : undefined;
    if (earlier) return { status: 200, body: earlier };
    const message = this.messageObject(channelId, { content: payload.content ?? '', embeds: payload.embeds ?? [], nonce: payload.nonce });
    if (nonceKey) this.nonces.set(nonceKey, message);
    return { status: 200, body: message };
  }
}

export async function startDiscordStandIn(): Promise<DiscordStandIn> {
  return new DiscordStandIn().start();
}
