import { describe, expect, it } from 'vitest';
import { polynomialRootModuli, polynomialRoots } from '../../../core/arma/roots';

describe('roots of 1 − c_1 z − … − c_k z^k', () => {
  it('1 − 1.5z + 0.5z² = (1 − z)(1 − 0.5z) has roots 1 and 2 (hand factorisation)', () => {
    const roots = polynomialRoots([1.5, -0.5])
      .map((r) => r.re)
      .sort((a, b) => a - b);
    expect(roots[0]).toBeCloseTo(1, 12);
    expect(roots[1]).toBeCloseTo(2, 12);
  });

  it('1 + 0.25z² has the complex pair ±2i, modulus 2 (hand arithmetic: z² = −4)', () => {
    const roots = polynomialRoots([0, -0.25]);
    expect(roots).toHaveLength(2);
    for (const r of roots) {
      expect(r.re).toBeCloseTo(0, 12);
      expect(Math.abs(r.im)).toBeCloseTo(2, 12);
    }
    expect(polynomialRootModuli([0, -0.25])).toEqual([expect.closeTo(2, 12), expect.closeTo(2, 12)]);
  });

  it('a trailing zero coefficient (a root at infinity) is left out; non-finite coefficients give no roots', () => {
    expect(polynomialRoots([0.5, 0])).toHaveLength(1);
    expect(polynomialRootModuli([0.5, 0])).toEqual([2]);
    expect(polynomialRoots([Number.NaN])).toEqual([]);
  });
});
