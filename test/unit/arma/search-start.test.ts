/**
 * The search's curvature start (informationStart.ts) and BFGS's use of a given inverse Hessian
 * (bfgs.ts).
 * Check values: the definitions. The expected Hessian of the concentrated objective
 * ½ log σ̂² + ½ Σ log F / n is the information per observation (Box, Jenkins & Reinsel, ch. 7), so on
 * a long simulated series the numerical Hessian at the true parameters must approach the inverse of
 * what the start gives (orders with p or q = 2 take the ψ-weight sums, p, q ≤ 1 the closed form);
 * for ARMA(1,1) the information is [[1/(1−φ²), −1/(1−φθ)], [−1/(1−φθ), 1/(1−θ²)]], and the start
 * must be the inverse of Jᵀ I J with J = diag(1 − π²); and BFGS started with the exact inverse Hessian
 * of a quadratic takes one Newton step to its minimum.
 */
import { describe, expect, it } from 'vitest';
import { createRng, simulateArma } from '../../../core/arma';
import { bfgsMinimize } from '../../../core/arma/bfgs';
import { inverseInformationStart } from '../../../core/arma/informationStart';
import { ArmaLikelihood } from '../../../core/arma/kalmanLikelihood';
import { unconstrainedToCoefficients } from '../../../core/arma/partialAutocorrelations';

/** u of a polynomial's coefficients, by inverting the partial-autocorrelation map numerically. */
function toU(coef: number[]): number[] {
  // Step-down recursion to partial autocorrelations, then atanh.
  let c = coef.slice();
  const pi = new Array<number>(c.length);
  for (let j = c.length - 1; j >= 0; j--) {
    const pj = c[j];
    pi[j] = pj;
    c = c.slice(0, j).map((v, i) => (v + pj * c[j - 1 - i]) / (1 - pj * pj));
  }
  return pi.map(Math.atanh);
}

/** Inverse of a small matrix by Gauss–Jordan elimination (the test's own, independent of the code). */
function invert(a: Float64Array, m: number): Float64Array {
  const A = Array.from(a);
  const out = new Float64Array(m * m);
  for (let i = 0; i < m; i++) out[i * m + i] = 1;
  for (let c = 0; c < m; c++) {
    const pv = A[c * m + c];
    for (let j = 0; j < m; j++) {
      A[c * m + j] /= pv;
      out[c * m + j] /= pv;
    }
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = A[r * m + c];
      for (let j = 0; j < m; j++) {
        A[r * m + j] -= f * A[c * m + j];
        out[r * m + j] -= f * out[c * m + j];
      }
    }
  }
  return out;
}

describe('inverse-information start', () => {
  it.each([
    [[0.6], [0.2]],
    [[-0.5], [0.4]],
    [[0.3], [-0.7]],
    [[0.5, -0.3], [0.4]],
    [[0.4], [0.3, -0.2]],
    [
      [0.5, 0.2],
      [-0.3, 0.2],
    ],
  ])('is the inverse of the objective’s Hessian in u on a long series (φ = %j, θ = %j)', (ar, ma) => {
    const p = ar.length;
    const q = ma.length;
    const m = p + q;
    const n = 20000;
    const y = Float64Array.from(simulateArma({ ar, ma, sigma2: 1, mean: 0 }, n, createRng(5)));
    const lik = new ArmaLikelihood(y, [], p, q);
    const work = new Float64Array(8);
    const arW = new Float64Array(p);
    const maW = new Float64Array(q);
    const f = (u: number[]): number => {
      unconstrainedToCoefficients(u, 0, p, arW, 0, work);
      unconstrainedToCoefficients(u, p, q, maW, 0, work);
      return lik.profile(arW, maW);
    };
    const u0 = [...toU(ar), ...toU(ma)];
    // The map back gives the coefficients again.
    unconstrainedToCoefficients(u0, 0, p, arW, 0, work);
    for (let i = 0; i < p; i++) expect(arW[i]).toBeCloseTo(ar[i], 12);
    const h = 1e-3;
    const at = (di: number, si: number, dj: number, sj: number): number => {
      const u = u0.slice();
      u[di] += si * h;
      u[dj] += sj * h;
      return f(u);
    };
    const H = Array.from({ length: m }, () => new Array<number>(m).fill(0));
    for (let i = 0; i < m; i++)
      for (let j = 0; j < m; j++)
        H[i][j] = (at(i, 1, j, 1) - at(i, 1, j, -1) - at(i, -1, j, 1) + at(i, -1, j, -1)) / (4 * h * h);
    const inv = new Float64Array(m * m);
    expect(inverseInformationStart(p, q, Float64Array.from(u0), inv)).toBe(true);
    // The expected Hessian is the inverse of what the start gives; compare entries on the scale of
    // the largest (the observed Hessian's sampling error is O(1/√n), about 1% here; a wrong sign
    // or lag in the information would be off by order one).
    const expected = invert(inv, m);
    let scale = 0;
    for (const v of expected) scale = Math.max(scale, Math.abs(v));
    let worst = 0;
    for (let i = 0; i < m; i++)
      for (let j = 0; j < m; j++) worst = Math.max(worst, Math.abs(H[i][j] - expected[i * m + j]) / scale);
    expect(worst).toBeLessThan(0.05);
  });

  it('equals the closed form for ARMA(1,1)', () => {
    for (const [phi, theta] of [
      [0.6, 0.2],
      [-0.9, 0.5],
      [0.2, -0.95],
    ]) {
      const out = new Float64Array(4);
      expect(
        inverseInformationStart(1, 1, Float64Array.from([Math.atanh(phi), Math.atanh(theta)]), out),
      ).toBe(true);
      // Jacobian of π = tanh(u): 1 − π²; information as in the header.
      const a = 1 - phi * phi;
      const c = 1 - theta * theta;
      const b = (-a * c) / (1 - phi * theta);
      const det = a * c - b * b;
      const want = [c / det, -b / det, -b / det, a / det];
      for (let k = 0; k < 4; k++) expect(out[k]).toBeCloseTo(want[k], 8);
    }
  });

  it('declines near a common factor (φ = θ), where the information is singular', () => {
    const u = Float64Array.from([Math.atanh(0.5), Math.atanh(0.5)]);
    expect(inverseInformationStart(1, 1, u, new Float64Array(4))).toBe(false);
  });
});

describe('BFGS with a given inverse Hessian', () => {
  it('reaches the minimum of a quadratic in one step when the start is its exact inverse Hessian', () => {
    // f = ½ xᵀAx − bᵀx with A = [[4, 1], [1, 3]]: minimum at A⁻¹b.
    const A = [4, 1, 1, 3];
    const b = [1, 2];
    const f = (x: Float64Array): number =>
      0.5 * (A[0] * x[0] * x[0] + 2 * A[1] * x[0] * x[1] + A[3] * x[1] * x[1]) - b[0] * x[0] - b[1] * x[1];
    const gradient = (x: Float64Array, _fx: number, out: Float64Array): void => {
      out[0] = A[0] * x[0] + A[1] * x[1] - b[0];
      out[1] = A[2] * x[0] + A[3] * x[1] - b[1];
    };
    const det = A[0] * A[3] - A[1] * A[2];
    const inverse = (_x: Float64Array, out: Float64Array): boolean => {
      out.set([A[3] / det, -A[1] / det, -A[2] / det, A[0] / det]);
      return true;
    };
    const withStart = bfgsMinimize(f, [0, 0], {
      gradient,
      initialInverseHessian: inverse,
      maxIterations: 50,
    });
    const plain = bfgsMinimize(f, [0, 0], { gradient, maxIterations: 50 });
    expect(withStart.iterations).toBe(1);
    expect(withStart.x[0]).toBeCloseTo((A[3] * b[0] - A[1] * b[1]) / det, 12);
    expect(withStart.x[1]).toBeCloseTo((A[0] * b[1] - A[2] * b[0]) / det, 12);
    expect(plain.iterations).toBeGreaterThan(1);
  });
});
