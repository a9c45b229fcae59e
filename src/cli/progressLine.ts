/** A batch shows progress only after this long, ms, so short runs stay quiet. */
export const PROGRESS_DELAY_MS = 2000;
/** Least time between two progress updates, ms. */
const PROGRESS_INTERVAL_MS = 250;

/**
 * The one-line progress of a batch on a terminal: silent for the first two seconds, then rewritten
 * in place. The clock is passed in, so the behaviour can be checked without waiting.
 */
export class ProgressLine {
  private readonly startedMs: number;
  private lastShownMs = -Infinity;
  private shown = false;

  constructor(
    private readonly write: (text: string) => void,
    private readonly enabled: boolean,
    private readonly nowMs: () => number,
  ) {
    this.startedMs = nowMs();
  }

  update(doneCount: number, failedCount: number): void {
    if (!this.enabled) return;
    const nowMs = this.nowMs();
    if (nowMs - this.startedMs < PROGRESS_DELAY_MS || nowMs - this.lastShownMs < PROGRESS_INTERVAL_MS) return;
    this.lastShownMs = nowMs;
    this.shown = true;
    this.write(`\r${describe(doneCount, failedCount, nowMs - this.startedMs)}\x1b[K`);
  }

  /** Clears the line before other text goes to the same terminal. */
  clear(): void {
    if (this.shown) this.write('\r\x1b[K');
  }

  finish(doneCount: number, failedCount: number): void {
    if (this.shown) this.write(`\r${describe(doneCount, failedCount, this.nowMs() - this.startedMs)}\x1b[K\n`);
  }
}

function describe(doneCount: number, failedCount: number, elapsedMs: number): string {
  const perSecond = elapsedMs > 0 ? Math.round((doneCount * 1000) / elapsedMs) : 0;
  return `analysed ${doneCount} profile(s), ${failedCount} failed, ${perSecond}/s`;
}
