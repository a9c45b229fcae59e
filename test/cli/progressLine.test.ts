import { describe, expect, it } from 'vitest';
import { PROGRESS_DELAY_MS, ProgressLine } from '../../src/cli/progressLine.ts';

/** A hand-driven clock: no waiting, no timing in the test. */
function harness(enabled: boolean) {
  let nowMs = 0;
  const written: string[] = [];
  const line = new ProgressLine((text) => written.push(text), enabled, () => nowMs);
  return { line, written, advance: (ms: number) => (nowMs += ms) };
}

describe('ProgressLine', () => {
  it('stays silent for the first two seconds of a batch', () => {
    const { line, written, advance } = harness(true);
    advance(PROGRESS_DELAY_MS - 1);
    line.update(10, 0);
    line.finish(10, 0);
    expect(written).toEqual([]);
  });

  it('shows the count after two seconds, rewrites in place, and ends with a newline', () => {
    const { line, written, advance } = harness(true);
    advance(PROGRESS_DELAY_MS);
    line.update(500, 2);
    expect(written).toHaveLength(1);
    expect(written[0]).toMatch(/^\ranalysed 500 profile\(s\), 2 failed, 250\/s/);
    line.update(501, 2); // too soon after the last update
    expect(written).toHaveLength(1);
    advance(300);
    line.update(600, 2);
    expect(written).toHaveLength(2);
    line.finish(600, 2);
    expect(written[written.length - 1].endsWith('\n')).toBe(true);
  });

  it('writes nothing when stderr is not a terminal', () => {
    const { line, written, advance } = harness(false);
    advance(10 * PROGRESS_DELAY_MS);
    line.update(1000, 0);
    line.finish(1000, 0);
    expect(written).toEqual([]);
  });
});
