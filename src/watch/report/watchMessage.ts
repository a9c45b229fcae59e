import { describeLocation } from '../../forecast/describeLocation.ts';
import { formatLocalDateHour, formatLocalHour, formatRunTime } from '../../render/localTime.ts';
import type { Message, MessageSection } from '../../render/message.ts';
import { buildMessage } from '../../render/safetyFooter.ts';
import { tableLines } from '../../render/tableText.ts';
import type { Crossing } from '../crossings/crossing.ts';
import { formatRuleValue } from '../crossings/crossingMessage.ts';
import { RULE_MEASURES } from '../rules/ruleCatalogue.ts';
import type { Rule } from '../rules/rule.ts';
import type { SeriesAssessment } from '../seriesAssessment.ts';
import { daySummaryLines } from './daySummaryLines.ts';
import { seriesTable } from './seriesTable.ts';
import { mostSevere } from '../rules/severityRank.ts';

export interface WatchReport {
  series: SeriesAssessment;
  crossings: Crossing[];
  rules: Rule[];
  /** What the source says it did to the data (ForecastSeries.notes). */
  sourceNotes: string[];
}

function crossingLine(crossing: Crossing): string {
  const repeats = crossing.repeatsSameDay > 0 ? ` It changes again ${crossing.repeatsSameDay} more time${crossing.repeatsSameDay === 1 ? '' : 's'} that day.` : '';
  // An end is news too, but it must not read like an alarm.
  const tag = crossing.direction === 'end' ? 'ENDS' : crossing.severity.toUpperCase();
  return `[${tag}] ${crossing.message}${repeats}`;
}

function ruleLine(rule: Rule): string {
  const measure = RULE_MEASURES[rule.id];
  const sign = measure.comparison === 'at-or-above' ? '≥' : '≤';
  return `${rule.id}: ${rule.name}, ${sign} ${formatRuleValue(rule.threshold, rule.unit)} (hysteresis ${formatRuleValue(rule.hysteresis, rule.unit)}), ${rule.severity}${rule.enabled ? '' : ', off'}`;
}

/**
 * The watch as one platform-neutral message: source, the hour-by-hour table, hours not assessed,
 * day summaries, crossings and the rules used. The footer is added by buildMessage and stays last.
 */
export function watchMessage(report: WatchReport): Message {
  const { series, crossings, rules } = report;
  const first = series.hours[0]?.validTime ?? series.gaps?.[0]?.validTime;
  const place = describeLocation({ latitude: series.location.latitude, longitude: series.location.longitude, name: series.location.name });
  const count = series.hours.length + (series.gaps?.length ?? 0);
  const title = `Stability watch: ${place}, ${count} h${first ? ` from ${formatLocalDateHour(first, series.timeZone)}` : ''}`;

  const sections: MessageSection[] = [
    {
      lines: [
        `Source: ${series.sourceName}, model ${series.model}, run ${formatRunTime(series.runTime)}; times are local (${series.timeZone}).`,
        ...(Number.isFinite(series.location.elevationM) ? [`Ground elevation ${Math.round(series.location.elevationM)} m; heights are above ground.`] : []),
        ...report.sourceNotes,
      ],
    },
    { heading: 'Hour by hour', lines: tableLines(seriesTable(series)) },
  ];

  const gaps = series.gaps ?? [];
  if (gaps.length > 0) {
    sections.push({
      heading: `Hours not assessed (${gaps.length}): not an all-clear`,
      lines: gaps.map((gap) => `${formatLocalHour(gap.validTime, series.timeZone)}: ${gap.reasons.join('; ')}`),
    });
  }

  sections.push({ heading: 'Day summaries', lines: series.days.length > 0 ? series.days.flatMap(daySummaryLines) : ['No hour could be assessed.'] });

  const gapNote = gaps.length > 0 ? ` ${gaps.length} hour${gaps.length === 1 ? ' was' : 's were'} not assessed; nothing is known of ${gaps.length === 1 ? 'it' : 'them'}.` : '';
  sections.push({
    heading: 'Crossings',
    lines: crossings.length > 0 ? crossings.map(crossingLine) : [`No rule changes state in the hours assessed.${gapNote}`],
  });
  sections.push({ heading: 'Rules used', lines: rules.map(ruleLine) });

  const alerting = crossings.filter((crossing) => crossing.direction !== 'end');
  const severity = mostSevere(alerting.map((crossing) => crossing.severity));
  return buildMessage({ kind: 'summary', title, sections, severity, inventedData: series.invented });
}
