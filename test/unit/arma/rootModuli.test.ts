/**
 * The closed-form root moduli for AR/MA parts of degree 1 and 2 (core/arma/roots.ts,
 * polynomialRootModuli) against the companion-matrix eigenvalues (eigenRootModuli, the reference).
 */
import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { eigenRootModuli as companion, polynomialRootModuli } from '../../../core/arma/roots';
import { minRootModulus } from '../../../core/select/engine';

describe('polynomialRootModuli (closed form for degree ≤ 2)', () => {
  it('agrees with the companion-matrix eigenvalues to 1e-12 on 4,000 random polynomials', () => {
    const rng = createRng(31);
    for (let i = 0; i < 4000; i++) {
      const coef = i % 2 ? [4 * rng.uniform() - 2, 2 * rng.uniform() - 1] : [4 * rng.uniform() - 2];
      const a = polynomialRootModuli(coef);
      const b = companion(coef);
      expect(a.length).toBe(b.length);
      for (let j = 0; j < a.length; j++) expect(Math.abs(a[j] - b[j])).toBeLessThan(1e-12 * (1 + b[j]));
    }
  });

  it('handles the edge cases the same way', () => {
    for (const coef of [[], [0], [0, 0], [0.5, 0], [0, -0.25], [2, -1], [Number.NaN], [1, Number.NaN]]) {
      expect(polynomialRootModuli(coef)).toEqual(companion(coef));
    }
    // 1 − 0.5z: root z = 2 (definition); 1 − z + 0.25 z² = (1 − 0.5z)²: double root 2.
    expect(polynomialRootModuli([0.5])).toEqual([2]);
    expect(polynomialRootModuli([1, -0.25])[0]).toBeCloseTo(2, 12);
    expect(polynomialRootModuli([1, -0.25])[1]).toBeCloseTo(2, 12);
    // 1 + 0.64 z²: complex pair of modulus 1/0.8 = 1.25.
    expect(minRootModulus([0, -0.64])).toBeCloseTo(1.25, 12);
    // Degree 3 goes to the eigenvalues: (1 − 0.5z)(1 − 0.25z)(1 − 0.2z) has roots 2, 4, 5.
    const c3 = [0.95, -0.275, 0.025];
    expect(polynomialRootModuli(c3).map((r) => Number(r.toFixed(10)))).toEqual([2, 4, 5]);
  });
});
