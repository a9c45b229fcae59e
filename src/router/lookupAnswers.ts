import { buildLookupMessage, prepareChartImage } from '../render/lookupMessage.ts';
import type { Message } from '../render/message.ts';
import type { RenderOptions } from '../render/renderOptions.ts';
import type { UnitSystem } from '../store/storeTypes.ts';
import type { SeriesAssessment } from '../watch/seriesAssessment.ts';

/**
 * Lookup answers, built once per assessment, units and options: every channel that asks about a
 * place during one forecast run gets the same answer, and building it (fifty formatted figures and
 * the chart's PNG) was a millisecond and a half of every answer. Kept with the assessment, so they
 * go when it goes. Shared answers are frozen; a picture's bytes cannot be frozen and are only sent.
 */
const answers = new WeakMap<SeriesAssessment, Map<string, Message>>();

function keyOf(units: UnitSystem, options: RenderOptions): string {
  // Every option, by name: one added later is part of the key without anyone remembering to add it.
  return JSON.stringify([units, JSON.stringify(options, Object.keys(options).sort())]);
}

function remembered(series: SeriesAssessment, key: string): Message | undefined {
  return answers.get(series)?.get(key);
}

function remember(series: SeriesAssessment, key: string, message: Message): Message {
  let byKey = answers.get(series);
  if (!byKey) answers.set(series, (byKey = new Map()));
  byKey.set(key, deepFreeze(message));
  return message;
}

/**
 * The lookup answer. When its chart still has to be drawn, `textReady` (if given) first receives
 * the answer without the chart, so the text can go out while the picture is made.
 */
export async function lookupAnswer(series: SeriesAssessment, units: UnitSystem, options: RenderOptions, textReady?: (textOnly: Message) => void): Promise<Message> {
  const key = keyOf(units, options);
  const known = remembered(series, key);
  if (known) return known;
  if (textReady && options.images !== false && series.hours.length > 0) {
    const textOptions = { ...options, images: false };
    const textKey = keyOf(units, textOptions);
    textReady(remembered(series, textKey) ?? remember(series, textKey, buildLookupMessage(series, units, textOptions)));
  }
  // The chart is rasterised off the event loop first; the builder then finds it ready.
  await prepareChartImage(series, units, options);
  const message = buildLookupMessage(series, units, options);
  // An answer whose picture could not be made is not kept: the next asker gets another try.
  if (message.images.length > 0 || options.images === false || series.hours.length === 0) remember(series, key, message);
  return message;
}

function deepFreeze<T>(value: T): T {
  if (typeof value !== 'object' || value === null || ArrayBuffer.isView(value) || Object.isFrozen(value)) return value;
  for (const inner of Object.values(value)) deepFreeze(inner);
  return Object.freeze(value);
}
