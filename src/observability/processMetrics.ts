/**
 * The process-wide metrics instance, and the two functions the forecast code calls. A module that
 * is not handed a metrics object (the forecast cache, the HTTP source) reports here; the health
 * server serves this registry unless told otherwise.
 */
import { createLapsewatchMetrics, type LapsewatchMetrics } from './lapsewatchMetrics.ts';

let shared: LapsewatchMetrics | null = null;

export function processMetrics(): LapsewatchMetrics {
  shared ??= createLapsewatchMetrics({ withProcessMetrics: true });
  return shared;
}

/** One forecast provider request finished (successfully or not) after `durationMs`. */
export function recordProviderRequest(source: string, durationMs: number, outcome: 'ok' | 'error'): void {
  processMetrics().providerRequestSeconds.observe({ source, outcome }, durationMs / 1000);
}

/** One forecast provider request failed; `kind` is the ForecastErrorKind ('timeout', 'server', ...). */
export function recordProviderError(source: string, kind: string): void {
  processMetrics().providerErrors.inc({ source, kind });
}

/** Wraps a provider call: times it and counts its failure. `isError` decides from the result. */
export async function timeProviderRequest<T>(
  source: string,
  call: () => Promise<T>,
  errorKindOf: (result: T) => string | null,
): Promise<T> {
  const startedAtMs = performance.now();
  try {
    const result = await call();
    const kind = errorKindOf(result);
    recordProviderRequest(source, performance.now() - startedAtMs, kind === null ? 'ok' : 'error');
    if (kind !== null) recordProviderError(source, kind);
    return result;
  } catch (error) {
    recordProviderRequest(source, performance.now() - startedAtMs, 'error');
    recordProviderError(source, 'exception');
    throw error;
  }
}
