/**
 * "Fri 14 Aug 15:00 MDT": an instant on a zone's wall clock, the way render/localTime.ts writes it,
 * but with one Intl formatter kept per zone. Building a date object per call cost about a
 * millisecond each, and a series makes dozens of these labels.
 */
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    try {
      formatter = new Intl.DateTimeFormat('en-US', {
        timeZone,
        weekday: 'short',
        day: 'numeric',
        month: 'short',
        hour: '2-digit',
        minute: '2-digit',
        hourCycle: 'h23',
        timeZoneName: 'short',
      });
    } catch {
      // An unknown zone must not break a message: UTC, which the label then says.
      formatter = formatterFor('UTC');
    }
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

export function formatLocalDateHourFast(isoInstant: string, timeZone: string): string {
  const instantMs = Date.parse(isoInstant);
  if (!Number.isFinite(instantMs)) return isoInstant;
  const parts: Record<string, string> = {};
  for (const part of formatterFor(timeZone).formatToParts(instantMs)) parts[part.type] = part.value;
  return `${parts.weekday} ${parts.day} ${parts.month} ${parts.hour}:${parts.minute} ${parts.timeZoneName}`;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** Model run time as forecasters write it: "12Z 14 Aug 2026". */
export function formatRunTimeFast(isoInstant: string): string {
  const run = new Date(Date.parse(isoInstant));
  if (Number.isNaN(run.getTime())) return isoInstant;
  return `${String(run.getUTCHours()).padStart(2, '0')}Z ${run.getUTCDate()} ${MONTHS[run.getUTCMonth()]} ${run.getUTCFullYear()}`;
}
