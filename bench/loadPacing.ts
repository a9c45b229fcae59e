/** How the chat-load generators wait for answers, shared by the Slack thread and the Discord side (they pace commands with src/jobPool.ts). */

/** `promise`, or a rejection naming `what` once the deadline (epoch ms) has passed. */
export function waitUntil<T>(promise: Promise<T>, deadline: number, what: string): Promise<T> {
  return Promise.race([promise, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no ${what} before the deadline`)), Math.max(0, deadline - Date.now())).unref())]);
}
