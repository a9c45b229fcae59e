/**
 * The process logger: structured JSON (pino) on stdout, or on a stream the caller gives (tests).
 *
 * Two rules hold here rather than at every call site:
 * - Tokens never reach a log line: any key that names a credential is censored wherever it sits
 *   (one or two levels deep; deeper objects are not logged by our code).
 * - Message bodies (the text a channel sees) are not logged at info: keys that carry them are
 *   censored too. Code that needs a body for debugging logs it with `logMessageBodyAtDebug`, which
 *   writes nothing unless the level is debug or lower.
 */
import pino, { type DestinationStream, type Logger } from 'pino';

export type { Logger };

/** Keys whose values are secrets. */
const SECRET_KEYS = ['token', 'botToken', 'appToken', 'signingSecret', 'password', 'authorization', 'apiKey', 'secret'];

/** Keys whose values are what a channel reads. */
const BODY_KEYS = ['payload', 'text', 'blocks', 'embeds', 'sections', 'body'];

const CENSOR = '[redacted]';

function redactPaths(): string[] {
  const keys = [...SECRET_KEYS, ...BODY_KEYS];
  return [...keys, ...keys.map((key) => `*.${key}`), 'headers.authorization', '*.headers.authorization'];
}

export interface LoggerOptions {
  /** pino level; default from LAPSEWATCH_LOG_LEVEL, else 'info'. */
  level?: string;
  /** Where lines go; stdout when absent. */
  destination?: DestinationStream;
  /** Extra fixed fields on every line, e.g. { workerId }. */
  base?: Record<string, unknown>;
}

export function createLogger(options: LoggerOptions = {}): Logger {
  const level = options.level ?? process.env.LAPSEWATCH_LOG_LEVEL ?? 'info';
  const config = {
    level,
    base: { app: 'lapsewatch', ...options.base },
    redact: { paths: redactPaths(), censor: CENSOR },
    timestamp: pino.stdTimeFunctions.isoTime,
  };
  return options.destination ? pino(config, options.destination) : pino(config);
}

/** A token-shaped string inside free text (an error message that quotes a header, say), masked. */
export function maskTokensInText(text: string): string {
  return text
    .replace(/\bxox[abposr]-[A-Za-z0-9-]+/g, 'xox*-[redacted]')
    .replace(/\bxapp-[A-Za-z0-9-]+/g, 'xapp-[redacted]')
    .replace(/\b(Bot|Bearer)\s+[A-Za-z0-9._-]{8,}/g, '$1 [redacted]')
    .replace(/(:\/\/[^:/@\s]+):[^@\s]*@/g, '$1:***@');
}

/** Logs what a channel will read, only when debug is on; the key is not one the redaction hides. */
export function logMessageBodyAtDebug(logger: Logger, context: Record<string, unknown>, bodyText: string): void {
  if (!logger.isLevelEnabled('debug')) return;
  logger.debug({ ...context, messageBodyDebug: bodyText }, 'message body');
}
