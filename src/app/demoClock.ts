import { acceleratedClock, systemClock, type Clock } from '../schedule/clock.ts';

export type ClockSetting = { ok: true; clock: Clock; description: string | null } | { ok: false; error: string };

/**
 * The scheduler's clock from the environment: LAPSEWATCH_CLOCK_SPEED (scenario minutes per real
 * minute, e.g. 600) and LAPSEWATCH_CLOCK_START (an ISO instant) let the demo show a morning summary
 * and an afternoon alert minutes apart. Neither set: the real clock.
 */
export function clockFromEnvironment(environment: NodeJS.ProcessEnv, realNowMs: () => number = Date.now): ClockSetting {
  const speedText = environment.LAPSEWATCH_CLOCK_SPEED?.trim();
  const startText = environment.LAPSEWATCH_CLOCK_START?.trim();
  if (!speedText && !startText) return { ok: true, clock: systemClock, description: null };
  const speedFactor = speedText ? Number(speedText) : 1;
  if (!Number.isFinite(speedFactor) || speedFactor < 1 || speedFactor > 100_000) {
    return { ok: false, error: `LAPSEWATCH_CLOCK_SPEED "${speedText}" must be a number from 1 to 100000 (e.g. 600: ten scenario hours per real minute)` };
  }
  const startAtMs = startText ? Date.parse(startText) : realNowMs();
  if (!Number.isFinite(startAtMs)) {
    return { ok: false, error: `LAPSEWATCH_CLOCK_START "${startText}" is not an ISO 8601 instant (e.g. 2026-08-14T12:00:00Z)` };
  }
  return {
    ok: true,
    clock: acceleratedClock(startAtMs, speedFactor, realNowMs),
    description: `scenario clock from ${new Date(startAtMs).toISOString()} at ${speedFactor}× real time`,
  };
}
