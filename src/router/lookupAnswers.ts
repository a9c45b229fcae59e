import { buildLookupMessage, prepareChartImage } from '../render/lookupMessage.ts';
import type { Message } from '../render/message.ts';
import type { RenderOptions } from '../render/renderOptions.ts';
import type { UnitSystem } from '../store/storeTypes.ts';
import type { SeriesAssessment } from '../watch/seriesAssessment.ts';

/**
 * Lookup answers, built once per assessment, units and footer: every channel that asks about a place
 * during one forecast run gets the same answer, and building it (fifty formatted figures and the
 * chart's PNG) was a millisecond and a half of every answer. Kept with the assessment, so they go
 * when it goes. Shared answers are frozen; a picture's bytes cannot be frozen and are only sent.
 */
const answers = new WeakMap<SeriesAssessment, Map<string, Message>>();

export async function lookupAnswer(series: SeriesAssessment, units: UnitSystem, options: RenderOptions): Promise<Message> {
  // Every option, by name: one added later is part of the key without anyone remembering to add it.
  const key = JSON.stringify([units, JSON.stringify(options, Object.keys(options).sort())]);
  const known = answers.get(series)?.get(key);
  if (known) return known;
  // The chart is rasterised off the event loop first; the builder then finds it ready.
  await prepareChartImage(series, units, options);
  const message = buildLookupMessage(series, units, options);
  // An answer whose picture could not be made is not kept: the next asker gets another try.
  if (message.images.length > 0 || options.images === false || series.hours.length === 0) {
    let byKey = answers.get(series);
    if (!byKey) answers.set(series, (byKey = new Map()));
    byKey.set(key, deepFreeze(message));
  }
  return message;
}

function deepFreeze<T>(value: T): T {
  if (typeof value !== 'object' || value === null || ArrayBuffer.isView(value) || Object.isFrozen(value)) return value;
  for (const inner of Object.values(value)) deepFreeze(inner);
  return Object.freeze(value);
}
