/**
 * Runs `count` jobs, `concurrency` at a time (one job at a time per worker), starting no new one
 * once `deadline` (epoch ms) has passed. Used by the Slack receiver's start-up warm-up and by the
 * chat bench's load generators.
 */
export async function pool(count: number, concurrency: number, deadline: number, job: (index: number, workerId: number) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async (_: unknown, workerId: number) => {
    while (next < count && Date.now() < deadline) await job(next++, workerId);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
}
