/**
 * Scratch space (typedArrays.ts): zero-filled views of one reused buffer inside nested scopes, plain
 * blocks outside them or when the buffer is full, and the contract the fit relies on — what a fit or
 * a forecast returns never lives in scratch, so a later fit cannot overwrite it.
 * Check values: the definitions (zero-filled arrays; a result computed twice is the same).
 */
import { describe, expect, it } from 'vitest';
import { createRng, fitArma, simulateArma } from '../../../core/arma';
import { forecastArma } from '../../../core/arma/forecast';
import { closeScratch, openScratch, scratchBlock, scratchState } from '../../../core/arma/typedArrays';

describe('scratch space', () => {
  it('is a plain zero-filled block outside every scope', () => {
    const [a, b] = scratchBlock([20, 30]);
    const [c] = scratchBlock([20]);
    expect(a.length + b.length).toBe(50);
    expect(a.buffer).toBe(b.buffer);
    expect(c.buffer).not.toBe(a.buffer);
    expect(scratchState().used).toBe(0);
  });

  it('reuses its buffer across scopes and zero-fills what it hands out again', () => {
    let mark = openScratch();
    const [a] = scratchBlock([40]);
    a.fill(7);
    const first = a.buffer;
    closeScratch(mark);
    mark = openScratch();
    const [b] = scratchBlock([40]);
    expect(b.buffer).toBe(first);
    expect(Array.from(b).every((v) => v === 0)).toBe(true);
    closeScratch(mark);
    expect(scratchState()).toMatchObject({ depth: 0, used: 0 });
  });

  it('frees an inner scope without touching the outer one', () => {
    const outer = openScratch();
    const [a] = scratchBlock([16]);
    a.fill(3);
    const inner = openScratch();
    const [b] = scratchBlock([16]);
    b.fill(5);
    closeScratch(inner);
    const [c] = scratchBlock([16]);
    expect(Array.from(a).every((v) => v === 3)).toBe(true);
    expect(Array.from(c).every((v) => v === 0)).toBe(true);
    closeScratch(outer);
  });

  it('falls back to a plain block when full and grows once every scope has closed', () => {
    const before = scratchState().capacity;
    const mark = openScratch();
    const [big] = scratchBlock([before + 10]);
    expect(big.length).toBe(before + 10);
    const [small] = scratchBlock([8 + 1]);
    expect(small.buffer).not.toBe(big.buffer);
    closeScratch(mark);
    expect(scratchState().capacity).toBeGreaterThanOrEqual(before + 10);
  });
});

describe('what fits and forecasts return is not scratch', () => {
  const series = (seed: number, n: number, missing: number[] = []): Float64Array => {
    const y = Float64Array.from(
      simulateArma({ ar: [0.6], ma: [0.3], sigma2: 4, mean: 50 }, n, createRng(seed)),
    );
    for (const t of missing) y[t] = Number.NaN;
    return y;
  };
  const snapshot = (f: ReturnType<typeof fitArma>) =>
    JSON.stringify({
      residuals: Array.from(f.residuals),
      standardized: Array.from(f.standardizedResiduals),
      fitted: Array.from(f.fitted),
      state: f.forecastState,
      ar: f.ar,
      ma: f.ma,
      stderr: f.stderr,
    });

  it('keeps a fit and its forecast unchanged while other fits reuse the scratch space', () => {
    const first = fitArma(series(1, 156), { p: 1, d: 0, q: 1 });
    const kept = snapshot(first);
    const fc = forecastArma(first, 12);
    const fcKept = JSON.stringify([Array.from(fc.mean), Array.from(fc.se)]);
    // Other orders, a missing stretch, differencing and a longer series all write into scratch.
    fitArma(series(2, 156, [40, 41, 42]), { p: 2, d: 0, q: 2 });
    fitArma(series(3, 300), { p: 3, d: 1, q: 2 });
    forecastArma(fitArma(series(4, 120), { p: 0, d: 0, q: 3 }), 52);
    expect(snapshot(first)).toBe(kept);
    expect(JSON.stringify([Array.from(fc.mean), Array.from(fc.se)])).toBe(fcKept);
    // And the same fit again gives the same figures.
    expect(snapshot(fitArma(series(1, 156), { p: 1, d: 0, q: 1 }))).toBe(kept);
    expect(scratchState()).toMatchObject({ depth: 0, used: 0 });
  });

  it('closes its scope when a fit throws', () => {
    expect(() => fitArma(series(5, 60), { p: 1, d: 0, q: 0, xreg: [new Float64Array(10)] })).toThrow(
      RangeError,
    );
    expect(scratchState()).toMatchObject({ depth: 0, used: 0 });
  });
});
