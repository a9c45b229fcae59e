// Waiting at the wire for something to have happened: a connection up, a call recorded, a row sent.

/** Resolves when `predicate` holds, checking every `pollMs`; rejects after `timeoutMs`. */
export async function waitUntil(predicate: () => boolean | Promise<boolean>, timeoutMs: number, what: string, pollMs = 50): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await predicate())) {
    if (Date.now() > deadline) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, pollMs));
  }
}
