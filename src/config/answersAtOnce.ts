/**
 * How many chat answers the answering thread works on at once (`chat.answersAtOnce`); the rest
 * wait in arrival order (adapters/answering/createAnswerDesk.ts says why). Measured with the chat
 * bench (200 commands, 20 at a time, loopback), two series:
 * - 5 rounds of unlimited, 4 and 6 in turn: Discord ack p99 39.0-57.5 ms unlimited, 23.4-42.3 with
 *   4, 28.5-32.1 with 6; Discord full-answer p95 168-256 ms unlimited, 100-158 with 6.
 * - 6 pairs of 64 (no limit for a burst of 20) and 6, on a busier machine: Discord ack p99 under
 *   50 ms in 2 of 6 runs with 64 (32.0-89.1) and 6 of 6 with 6 (36.6-47.9); full-answer p95 lower
 *   with 6 in 6 of 6 pairs for Discord and 5 of 6 for Slack; Slack ack p99 under 50 in all 6 with
 *   6 (30.8-45.2), over it twice with 64 (52.2, 61.2).
 * - 6 more such pairs later: Discord ack p99 under 50 in 2 of 6 with 64 (34.6-73.5), 4 of 6 with 6
 *   (25.1-69.7); full-answer p95 lower with 6 in 6 of 6 pairs for Discord, 5 of 6 for Slack. But
 *   Slack's ack p99 was higher with 6 in 5 of the 6 pairs (24.8-69.4 against 24.2-64.3; over 50
 *   once each), and in 4 of the 6 pairs before: the limit does not help Slack's acknowledgements.
 */
export const DEFAULT_ANSWERS_AT_ONCE = 6;

/** The most the setting allows: beyond it a burst is as good as unlimited. */
export const MAX_ANSWERS_AT_ONCE = 64;
