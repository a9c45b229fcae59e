/**
 * How the bot process runs: its V8 flags (`npm start` in package.json, and the benchmark's bot
 * process), its environment, and the priority of its answering thread. A test holds package.json's
 * start script to BOT_ENVIRONMENT and BOT_NODE_FLAGS.
 */

/**
 * A long-running process on a small machine: V8 is asked for a small heap. A 1 MB semi-space
 * (young generation) and old-generation growth in 10 % steps, instead of V8's defaults (16 MB
 * semi-spaces, growth by a factor), which grow the heap far past what it keeps alive.
 * Measured on the 1,000-channel alert cycle with both chat receivers up (`npm run bench alerts`):
 * rss high-water 314 MB with V8's defaults, 181/190 MB with these (cycle / cycle + delivery).
 * `--optimize-for-size` held the heap as small (180/188 MB) but made every computation slower
 * (an assessment of a 48-hour series 11 ms against 4.5 ms warm, the alert cycle 12.0 s against 9.5 s).
 */
export const BOT_NODE_FLAGS: readonly string[] = ['--max-semi-space-size=1', '--heap-growing-percent=10'];

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
