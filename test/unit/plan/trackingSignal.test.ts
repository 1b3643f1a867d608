import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { forecastBiasFlag, trackForecasts, trackingLimit } from '../../../core/plan/trackingSignal';
import { addWeeks } from '../../../core/series/calendar';

describe('smoothed tracking signal (Trigg 1964)', () => {
  it('limit for α = 0.1: 1.96·√(0.1/1.9)/√(2/π) = 0.5636', () => {
    // √(0.1/1.9) = 0.229416; √(2/π) = 0.797885; 1.959964 × 0.229416 / 0.797885 = 0.56355.
    expect(trackingLimit(0.1)).toBeCloseTo(0.56355, 4);
  });

  it('hand-worked: errors +2, +2, −1 with se 1.25 (M₀ = 0.997), α = 0.1', () => {
    // M₀ = √(2/π)·1.25 = 0.99736. E: 0.2, 0.38, 0.242. M: 0.1·2 + 0.9·0.99736 = 1.09762;
    // 0.1·2 + 0.9·1.09762 = 1.18786; 0.1·1 + 0.9·1.18786 = 1.16907. T = 0.242 / 1.16907 = 0.20700.
    const w = ['2024-01-01', '2024-01-08', '2024-01-15'];
    const t = trackForecasts(
      w.map((week) => ({ week, mean: 10, se: 1.25 })),
      w,
      [12, 12, 9],
    );
    expect(t?.count).toBe(3);
    expect(t?.bias).toBeCloseTo(1, 12); // (2 + 2 − 1)/3
    expect(t?.trackingSignal).toBeCloseTo(0.207, 3);
  });

  it('unbiased normal errors are flagged about 5% of the time; a bias of 0.8σ over 26 weeks nearly always', () => {
    const rng = createRng(99);
    const n = 52;
    const w = Array.from({ length: n }, (_, i) => addWeeks('2024-01-01', i));
    let falseAlarms = 0;
    let hits = 0;
    const reps = 400;
    for (let r = 0; r < reps; r++) {
      const past = w.map((week) => ({ week, mean: 100, se: 10 }));
      const fair = w.map(() => 100 + 10 * rng.normal());
      const biased = w.map((_, i) => 100 + 10 * rng.normal() + (i >= 26 ? 8 : 0));
      if (forecastBiasFlag(trackForecasts(past, w, fair))) falseAlarms++;
      if (forecastBiasFlag(trackForecasts(past, w, biased))) hits++;
    }
    // The limit is a normal approximation (the signal is autocorrelated and bounded), so allow 2–10%.
    expect(falseAlarms / reps).toBeGreaterThan(0.02);
    expect(falseAlarms / reps).toBeLessThan(0.1);
    expect(hits / reps).toBeGreaterThan(0.8);
  });

  it('needs 8 matched weeks before it flags; unmatched or duplicate weeks are skipped', () => {
    const w = Array.from({ length: 7 }, (_, i) => addWeeks('2024-01-01', i));
    const past = w.map((week) => ({ week, mean: 1, se: 1 }));
    const t = trackForecasts(
      [...past, { week: w[0], mean: 999, se: 1 }, { week: '2030-01-07', mean: 1, se: 1 }],
      w,
      w.map(() => 50),
    );
    expect(t?.count).toBe(7);
    expect(forecastBiasFlag(t)).toBeNull();
    expect(trackForecasts(past, [], [])).toBeNull();
  });
});
