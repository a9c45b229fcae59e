/**
 * When a morning summary set for a local time of day falls on a given local date, in a time zone,
 * with daylight-saving changes handled so that it runs exactly once every day:
 *
 * - The time exists once (most days, and 06:30 on both change days in North America): that instant.
 * - The time does not exist (spring forward skips it, e.g. 02:30 in America/Denver): the first
 *   instant after the gap, at the same distance past the skipped hour (02:30 → 03:30 MDT). This is
 *   what luxon does when asked for a wall time inside a gap.
 * - The time exists twice (fall back repeats it, e.g. 01:30): the first of the two (the earlier,
 *   daylight-time offset). The second is never a separate occurrence.
 */
import { DateTime } from 'luxon';

const LOCAL_TIME = /^([01]\d|2[0-3]):([0-5]\d)$/;
const LOCAL_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

export function parseLocalTimeOfDay(localTime: string): { hour: number; minute: number } {
  const match = LOCAL_TIME.exec(localTime);
  if (!match) throw new Error(`summary time "${localTime}" is not HH:MM (24 h), e.g. 06:30`);
  return { hour: Number(match[1]), minute: Number(match[2]) };
}

/** The instant (epoch ms) the summary for `localDate` is due. */
export function summaryInstantMs(localDate: string, localTime: string, timeZone: string): number {
  const date = LOCAL_DATE.exec(localDate);
  if (!date) throw new Error(`local date "${localDate}" is not YYYY-MM-DD`);
  const { hour, minute } = parseLocalTimeOfDay(localTime);
  // luxon moves a skipped wall time forward past the gap; an ambiguous one it may resolve to either
  // offset, so the earlier instant is looked for explicitly below.
  const local = DateTime.fromObject(
    { year: Number(date[1]), month: Number(date[2]), day: Number(date[3]), hour, minute },
    { zone: timeZone },
  );
  if (!local.isValid) throw new Error(`cannot place ${localDate} ${localTime} in time zone ${timeZone}: ${local.invalidExplanation ?? local.invalidReason}`);
  const wall = local.toFormat('yyyy-MM-dd HH:mm');
  if (wall !== `${localDate} ${localTime}`) return local.toMillis(); // in a gap: already moved forward
  // Repeated hour: the same wall time an offset change earlier (1 h nearly everywhere, 30 min on Lord Howe).
  for (const shiftMinutes of [60, 30]) {
    const earlier = DateTime.fromMillis(local.toMillis() - shiftMinutes * 60_000, { zone: timeZone });
    if (earlier.toFormat('yyyy-MM-dd HH:mm') === wall) return earlier.toMillis();
  }
  return local.toMillis();
}

/** The local calendar date at an instant in a zone, `YYYY-MM-DD`. */
export function localDateAt(nowMs: number, timeZone: string): string {
  return DateTime.fromMillis(nowMs, { zone: timeZone }).toISODate()!;
}

export interface SummaryDueInput {
  nowMs: number;
  localTime: string;
  timeZone: string;
  /** The local date of the last summary sent for these watches, or null. */
  lastSummaryLocalDate: string | null;
  /** How late a missed summary may still go out (the bot was down at 06:30); default 3 h. */
  catchUpMs?: number;
}

/**
 * The local date whose summary is due now, or null. Due when today's occurrence has passed, no
 * summary was sent for today, and it is not later than the catch-up window: a bot restarted at
 * 07:10 still sends the 06:30 summary, one restarted at 15:00 waits for tomorrow.
 */
export function dueSummaryDate(input: SummaryDueInput): string | null {
  const catchUpMs = input.catchUpMs ?? 3 * 3600_000;
  const today = localDateAt(input.nowMs, input.timeZone);
  if (input.lastSummaryLocalDate !== null && input.lastSummaryLocalDate >= today) return null;
  const dueAtMs = summaryInstantMs(today, input.localTime, input.timeZone);
  if (input.nowMs < dueAtMs || input.nowMs >= dueAtMs + catchUpMs) return null;
  return today;
}
