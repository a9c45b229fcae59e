/**
 * Every failure the store reports on purpose. `code` lets start-up and callers tell them apart;
 * `message` is written for the person who has to fix it (names the file, URL or field and the cause).
 */
export type StoreErrorCode =
  | 'invalid-url'
  | 'missing-file'
  | 'unreadable-file'
  | 'corrupt-file'
  | 'not-a-store'
  | 'unreachable'
  | 'migration-failed'
  | 'invalid-input';

export class StoreError extends Error {
  readonly code: StoreErrorCode;

  constructor(code: StoreErrorCode, message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'StoreError';
    this.code = code;
  }
}

export function isStoreError(value: unknown, code?: StoreErrorCode): value is StoreError {
  return value instanceof StoreError && (code === undefined || value.code === code);
}

/** The message of an unknown thrown value, for wrapping into a clearer one. */
export function causeMessage(error: unknown): string {
  if (error instanceof Error) {
    const code = (error as { code?: unknown }).code;
    return typeof code === 'string' && !error.message.includes(code) ? `${error.message} (${code})` : error.message;
  }
  return String(error);
}
