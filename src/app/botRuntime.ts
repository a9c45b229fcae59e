/**
 * How the bot process runs: its V8 flags (`npm start` in package.json, and the benchmark's bot
 * process), its environment, and the priority of its answering thread. A test holds package.json's
 * start script to BOT_ENVIRONMENT and BOT_NODE_FLAGS.
 */

/**
 * A long-running process on a small machine: V8 is asked to favour a small heap over peak speed.
 * Measured on the 1,000-channel alert cycle with both chat receivers up (`npm run bench alerts`):
 * rss high-water 314 MB without, ~185 MB with; the cycle ~7.5 s against ~9.5 s. The price is CPU
 * per chat answer (about +40 %, `npm run bench chat` prints both).
 */
export const BOT_NODE_FLAGS: readonly string[] = ['--optimize-for-size'];

/**
 * Environment the bot process starts with (glibc reads it before the first allocation, so it
 * cannot be set from inside). Two malloc arenas instead of one per thread: the threads (receivers,
 * libuv pool) otherwise each keep their own partly used arenas, ~8-10 MB of rss measured.
 */
export const BOT_ENVIRONMENT: Readonly<Record<string, string>> = { MALLOC_ARENA_MAX: '2' };

/**
 * Nice value of the main (answering) thread once the chat receivers run in their own thread: under
 * CPU contention the kernel then runs acknowledgements first. The scheduler and the outbox sender
 * share this thread; they are not latency-bound.
 */
export const ANSWER_THREAD_NICE = 10;
