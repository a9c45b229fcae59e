import { describe, expect, it } from 'vitest';
import { warmUpAssessment, warmUpSeries } from '../../src/app/warmUpAssessment.ts';
import { assessSeries } from '../../src/watch/assessSeries.ts';

describe('assessment warm-up at start', () => {
  it('assesses invented series that take the coupling branch, so that path is the one compiled', async () => {
    const series = await warmUpSeries();
    expect(series.length).toBeGreaterThanOrEqual(2);
    for (const one of series) {
      expect(one.invented).toBe(true);
      const assessed = assessSeries(one);
      expect(assessed.gaps).toEqual([]);
      expect(assessed.hours).toHaveLength(48);
      // The headline path: the mixed layer reaching a dry layer aloft on some afternoon.
      expect(assessed.hours.some((hour) => hour.coupled)).toBe(true);
    }
  });

  it('gives way between rounds: a timer set as it starts fires before it ends', async () => {
    const events: string[] = [];
    const warming = warmUpAssessment(6).then((done) => {
      events.push(`warmed ${done.rounds}`);
      return done;
    });
    setTimeout(() => events.push('timer'), 0);
    const done = await warming;
    expect(done.rounds).toBe(6);
    expect(done.elapsedMs).toBeGreaterThan(0);
    // A warm-up that ran every round in one go would hold a command back until its end.
    expect(events).toEqual(['timer', 'warmed 6']);
  });
});
