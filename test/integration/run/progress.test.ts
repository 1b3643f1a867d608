/**
 * Progress figures of a run: the rate over the recent window and the time left at that rate
 * (definitions in app/run/progress.ts), and the two renderings the command line uses.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ProgressTracker } from '../../../app/run/progress';
import { progressBar, progressText } from '../../../app/run/progressView';

describe('run progress', () => {
  beforeEach(() => {
    vi.useFakeTimers();
    vi.setSystemTime(new Date('2026-01-05T00:00:00Z'));
  });
  afterEach(() => vi.useRealTimers());

  it('rate over the recent window, time left at that rate, reused items counted as done', () => {
    const p = new ProgressTracker(110, 10); // 10 reused at the start
    for (let i = 0; i < 20; i++) {
      vi.advanceTimersByTime(100);
      p.advance();
    }
    // 20 items in 2 s = 10 items/s; 110 − 30 = 80 left → 8 s (by definition)
    const s = p.snapshot('planning');
    expect(s.done).toBe(30);
    expect(s.itemsPerSecond).toBeCloseTo(10, 9);
    expect(s.secondsLeft).toBeCloseTo(8, 9);
    // The pace halves for 10 s: the window (5 s) follows it, the overall average would not.
    for (let i = 0; i < 50; i++) {
      vi.advanceTimersByTime(200);
      p.advance();
    }
    const t = p.snapshot('planning');
    expect(t.itemsPerSecond).toBeGreaterThan(4.5);
    expect(t.itemsPerSecond).toBeLessThan(5.5);
    expect(progressText(t)).toMatch(/^planning 80\/110 \(73%\), 5\.\d items\/s, left 0:0[56]$/);
    expect(progressBar({ ...t, done: 55, total: 110 }, 10)).toMatch(
      /^\[#####\.\.\.\.\.\] planning 55\/110 \(50%\)/,
    );
  });

  it('no rate before the first item, none left at the end', () => {
    const p = new ProgressTracker(3);
    expect(p.snapshot('planning').secondsLeft).toBeNull();
    vi.advanceTimersByTime(500);
    p.advance(3);
    expect(p.snapshot('done').secondsLeft).toBe(0);
  });
});
