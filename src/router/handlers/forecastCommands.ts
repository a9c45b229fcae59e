import { DateTime } from 'luxon';
import { buildDetailMessage, prepareDetailImage, type DetailContext } from '../../render/detailMessage.ts';
import type { Message } from '../../render/message.ts';
import type { HourAssessment, SeriesAssessment } from '../../watch/seriesAssessment.ts';
import type { PlaceRef } from '../commandGrammar.ts';
import { fetchAssessment } from '../fetchAssessment.ts';
import { lookupAnswer } from '../lookupAnswers.ts';
import { errorMessage } from '../replies.ts';
import { resolvePlace, type ResolvedPlace } from '../resolvePlace.ts';
import type { HandlerContext } from '../routerContext.ts';

export async function lookUp(context: HandlerContext, ref: PlaceRef): Promise<Message> {
  const resolved = await resolvePlace(context, ref);
  if (!resolved.ok) return errorMessage(resolved.error, context.localFooterLine);
  const assessed = await fetchAssessment(context, resolved.place, { keepAnalysis: false });
  if (!assessed.ok) return errorMessage(assessed.error, context.localFooterLine);
  return lookupAnswer(assessed.series, context.channel.unitSystem, { footerLocalLine: context.localFooterLine });
}

/** Which hour the detail view shows when the user names none: the coupling hour, else the deepest mixing. */
function defaultHour(series: SeriesAssessment): HourAssessment | undefined {
  const coupled = series.hours.find((hour) => hour.coupled);
  if (coupled) return coupled;
  return series.hours.reduce<HourAssessment | undefined>((best, hour) => (!best || hour.effectiveMixingHeightAglM > best.effectiveMixingHeightAglM ? hour : best), undefined);
}

function hourAtLocal(series: SeriesAssessment, localHour: number, dayOffset: 0 | 1, nowMs: number): HourAssessment | undefined {
  const day = DateTime.fromMillis(nowMs, { zone: series.timeZone }).startOf('day').plus({ days: dayOffset });
  const wantedMs = day.set({ hour: localHour }).toMillis();
  return series.hours.find((hour) => Date.parse(hour.validTime) === wantedMs);
}

export async function showDetail(context: HandlerContext, ref: PlaceRef, localHour: number | null, dayOffset: 0 | 1): Promise<Message> {
  const resolved = await resolvePlace(context, ref);
  if (!resolved.ok) return errorMessage(resolved.error, context.localFooterLine);
  return detailFor(context, resolved.place, (series) => (localHour === null ? defaultHour(series) : hourAtLocal(series, localHour, dayOffset, context.nowMs())), localHour === null ? 'the hour that matters most' : `${String(localHour).padStart(2, '0')}:00 ${dayOffset === 1 ? 'tomorrow' : 'today'}`);
}

/** The detail view of one valid time (from a button). */
export async function showDetailAt(context: HandlerContext, place: ResolvedPlace, validTime: string): Promise<Message> {
  const wantedMs = Date.parse(validTime);
  const startMs = Math.min(context.nowMs(), wantedMs);
  return detailFor(context, place, (series) => series.hours.find((hour) => Date.parse(hour.validTime) === wantedMs), validTime, startMs);
}

async function detailFor(
  context: HandlerContext,
  place: ResolvedPlace,
  pick: (series: SeriesAssessment) => HourAssessment | undefined,
  wantedLabel: string,
  startMs?: number,
): Promise<Message> {
  const assessed = await fetchAssessment(context, place, { keepAnalysis: true, startMs });
  if (!assessed.ok) return errorMessage(assessed.error, context.localFooterLine);
  const { series } = assessed;
  const hour = pick(series);
  if (!hour || !hour.analysis) {
    return errorMessage(`No forecast hour for ${wantedLabel} at ${place.displayName} in the next ${context.forecastHours} h. Try \`detail ${place.savedName ?? `${place.latitudeDeg},${place.longitudeDeg}`} 15\`.`, context.localFooterLine);
  }
  const detailContext: DetailContext = {
    timeZone: series.timeZone,
    invented: series.invented,
    placeName: place.displayName,
    model: series.model,
    runTime: series.runTime,
    sourceName: series.sourceName,
    footerLocalLine: context.localFooterLine,
  };
  await prepareDetailImage(hour, context.channel.unitSystem, detailContext);
  return buildDetailMessage(hour, context.channel.unitSystem, detailContext);
}
