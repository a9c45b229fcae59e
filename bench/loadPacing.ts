/** How the chat-load generators pace their commands, shared by the Slack thread and the Discord side. */

/** Runs `count` jobs, `concurrency` at a time (one job at a time per worker), stopping new ones at the deadline. */
export async function pool(count: number, concurrency: number, deadline: number, job: (index: number, workerId: number) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async (_: unknown, workerId: number) => {
    while (next < count && Date.now() < deadline) await job(next++, workerId);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
}

/** `promise`, or a rejection naming `what` once the deadline (epoch ms) has passed. */
export function waitUntil<T>(promise: Promise<T>, deadline: number, what: string): Promise<T> {
  return Promise.race([promise, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no ${what} before the deadline`)), Math.max(0, deadline - Date.now())).unref())]);
}
