/**
 * The V8 flags the bot runs with (`npm start` in package.json, and the benchmark's bot process):
 * a long-running process on a small machine, so V8 is asked to favour a small heap over peak speed.
 * Measured on the 1,000-channel alert cycle: rss high-water 239 MB without, 172 MB with, the cycle
 * 8.5 s against 11.9 s (`npm run bench alerts`). A test holds package.json's start script to this list.
 */
export const BOT_NODE_FLAGS: readonly string[] = ['--optimize-for-size'];
