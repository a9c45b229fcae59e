/**
 * The scheduler's notion of now. Production uses the system clock at speed 1. The demo runs a
 * scenario clock that starts at a chosen instant and runs `speedFactor` times faster than real
 * time, so a morning summary and an afternoon alert arrive minutes apart. Tests use a manual clock
 * and call `tick(nowMs)` themselves.
 */
export interface Clock {
  nowMs(): number;
  /** Scenario milliseconds per real millisecond (1 for the system clock). */
  readonly speedFactor: number;
}

export const systemClock: Clock = { nowMs: () => Date.now(), speedFactor: 1 };

/** A clock that starts at `startAtMs` and runs `speedFactor` times faster than the real one. */
export function acceleratedClock(startAtMs: number, speedFactor: number, realNowMs: () => number = Date.now): Clock {
  if (!(speedFactor > 0)) throw new Error(`clock speed factor must be positive, got ${speedFactor}`);
  const realStartMs = realNowMs();
  // Whole milliseconds: the store takes integer epoch times.
  return { nowMs: () => Math.floor(startAtMs + (realNowMs() - realStartMs) * speedFactor), speedFactor };
}

/** A clock that only moves when told (tests). */
export class ManualClock implements Clock {
  readonly speedFactor = 1;
  constructor(private currentMs: number) {}
  nowMs(): number {
    return this.currentMs;
  }
  set(nowMs: number): void {
    this.currentMs = nowMs;
  }
  advance(byMs: number): void {
    this.currentMs += byMs;
  }
}
