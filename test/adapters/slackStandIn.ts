// A stand-in for Slack's side of the wire, on 127.0.0.1: the Web API (/api/<method>), the upload
// URLs it hands out, response URLs (/respond/<id>) and, when asked, a Socket Mode WebSocket.
// Reusable by the delivery tests: faults via addFault (429 with Retry-After, 500 for a while) and
// per-method Slack errors via failMethod ("channel_not_found", "msg_too_long", ...).
import { WebSocketServer, type WebSocket } from 'ws';
import { RecordingServer, type RecordedCall, type Reply } from './recordingServer.ts';

export interface SocketAck {
  envelope_id: string;
  payload?: unknown;
}

export class SlackStandIn extends RecordingServer {
  readonly teamId = 'T0INVENTED';
  readonly botUserId = 'U0LAPSEBOT';
  private readonly methodErrors = new Map<string, string[]>();
  private postCounter = 0;
  private uploadCounter = 0;
  private wss: WebSocketServer | undefined;
  private readonly socketClients: WebSocket[] = [];
  readonly socketAcks: SocketAck[] = [];
  private ackWaiters = new Map<string, (ack: SocketAck) => void>();
  private helloWaiters: Array<() => void> = [];

  constructor() {
    super((call) => this.answer(call));
  }

  /** Web API base for WebClient's slackApiUrl. */
  get apiUrl(): string {
    return `${this.origin}/api/`;
  }

  /** A response URL that lands on this stand-in. */
  responseUrl(id: string): string {
    return `${this.origin}/respond/${id}`;
  }

  /** The next `times` calls of `method` answer { ok: false, error }. */
  failMethod(method: string, error: string, times = 1): void {
    const queue = this.methodErrors.get(method) ?? [];
    for (let i = 0; i < times; i += 1) queue.push(error);
    this.methodErrors.set(method, queue);
  }

  apiCalls(method: string): RecordedCall[] {
    return this.calls.filter((call) => call.path === `/api/${method}`);
  }

  /** Turns on the Socket Mode endpoint; apps.connections.open then hands out its URL. */
  enableSocketMode(): void {
    this.wss = new WebSocketServer({ server: this.server, path: '/socket' });
    this.wss.on('connection', (socket) => {
      this.socketClients.push(socket);
      socket.on('message', (data) => {
        const ack = JSON.parse(data.toString()) as SocketAck;
        this.socketAcks.push(ack);
        this.ackWaiters.get(ack.envelope_id)?.(ack);
        this.ackWaiters.delete(ack.envelope_id);
      });
      socket.send(JSON.stringify({ type: 'hello', num_connections: 1, connection_info: { app_id: 'A0LAPSE' }, debug_info: { host: 'stand-in' } }));
      for (const wake of this.helloWaiters.splice(0)) wake();
    });
  }

  /** Resolves when a Socket Mode client has connected and been greeted. */
  async socketConnected(timeoutMs = 5_000): Promise<void> {
    if (this.socketClients.length > 0) return;
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error('no Socket Mode connection')), timeoutMs);
      this.helloWaiters.push(() => {
        clearTimeout(timer);
        resolve();
      });
    });
  }

  /** Sends an envelope over the socket and resolves with the client's acknowledgement. */
  sendEnvelope(type: 'slash_commands' | 'interactive', payload: object, timeoutMs = 5_000): Promise<SocketAck> {
    const socket = this.socketClients.at(-1);
    if (!socket) throw new Error('no Socket Mode client connected');
    const envelopeId = `env-${Math.random().toString(36).slice(2)}`;
    const acked = new Promise<SocketAck>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`envelope ${envelopeId} not acknowledged`)), timeoutMs);
      this.ackWaiters.set(envelopeId, (ack) => {
        clearTimeout(timer);
        resolve(ack);
      });
    });
    socket.send(JSON.stringify({ envelope_id: envelopeId, type, payload, accepts_response_payload: type === 'slash_commands' }));
    return acked;
  }

  override async stop(): Promise<void> {
    // A clean close first, so the client sees a normal goodbye rather than a broken socket.
    await Promise.all(
      this.socketClients.map(
        (socket) =>
          new Promise<void>((resolve) => {
            if (socket.readyState === socket.CLOSED) return resolve();
            const timer = setTimeout(() => {
              socket.terminate();
              resolve();
            }, 1_000);
            socket.once('close', () => {
              clearTimeout(timer);
              resolve();
            });
            socket.close(1000, 'stand-in stopping');
          }),
      ),
    );
    if (this.wss) await new Promise<void>((resolve) => this.wss!.close(() => resolve()));
    await super.stop();
  }

  private answer(call: RecordedCall): Reply {
    if (call.path.startsWith('/respond/')) return { status: 200, body: 'ok' };
    if (call.path.startsWith('/upload/')) return { status: 200, body: `OK - ${call.raw.length}` };
    if (!call.path.startsWith('/api/')) return { status: 404, body: 'not found' };
    const method = call.path.slice('/api/'.length);
    const queued = this.methodErrors.get(method);
    if (queued && queued.length > 0) return { status: 200, body: { ok: false, error: queued.shift() } };
    return { status: 200, body: this.apiResult(method, call) };
  }

  private apiResult(method: string, call: RecordedCall): object {
    switch (method) {
      case 'auth.test':
        return { ok: true, url: 'https://invented.example.invalid/', team: 'Invented', user: 'lapsewatch', team_id: this.teamId, user_id: this.botUserId, bot_id: 'B0LAPSE' };
      case 'chat.postMessage': {
        this.postCounter += 1;
        const ts = `1700000000.${String(this.postCounter).padStart(6, '0')}`;
        return { ok: true, channel: call.body?.channel, ts, message: { text: call.body?.text, ts } };
      }
      case 'files.getUploadURLExternal': {
        this.uploadCounter += 1;
        const fileId = `F${String(this.uploadCounter).padStart(8, '0')}`;
        return { ok: true, upload_url: `${this.origin}/upload/${fileId}`, file_id: fileId };
      }
      case 'files.completeUploadExternal': {
        const files = JSON.parse(call.body?.files ?? '[]') as Array<{ id: string; title?: string }>;
        return { ok: true, files: files.map((f) => ({ id: f.id, title: f.title ?? '' })) };
      }
      case 'apps.connections.open':
        return this.wss ? { ok: true, url: `${this.wsOrigin}/socket` } : { ok: false, error: 'socket_mode_not_enabled' };
      default:
        return { ok: true };
    }
  }
}

export async function startSlackStandIn(options: { socketMode?: boolean } = {}): Promise<SlackStandIn> {
  const standIn = new SlackStandIn();
  if (options.socketMode) standIn.enableSocketMode();
  return standIn.start();
}
