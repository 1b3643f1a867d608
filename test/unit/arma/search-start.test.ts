/**
 * The search's curvature start for ARMA(1,1) (searchOptimum.ts arma11InverseInformation) and
 * BFGS's use of a given inverse Hessian (bfgs.ts).
 * Check values: the definitions. The expected Hessian of the concentrated objective
 * ½ log σ̂² + ½ Σ log F / n is the information per observation (Box, Jenkins & Reinsel, ch. 7),
 * so on a long simulated series the numerical Hessian at the true parameters must approach the
 * inverse of what the start gives; and BFGS started with the exact inverse Hessian of a quadratic
 * takes one Newton step to its minimum.
 */
import { describe, expect, it } from 'vitest';
import { createRng, simulateArma } from '../../../core/arma';
import { bfgsMinimize } from '../../../core/arma/bfgs';
import { ArmaLikelihood } from '../../../core/arma/kalmanLikelihood';
import { arma11InverseInformation } from '../../../core/arma/searchOptimum';

describe('ARMA(1,1) inverse-information start', () => {
  it.each([
    [0.6, 0.2],
    [-0.5, 0.4],
    [0.3, -0.7],
  ])('is the inverse of the objective’s Hessian in u on a long series (φ = %f, θ = %f)', (phi, theta) => {
    const n = 20000;
    const y = Float64Array.from(
      simulateArma({ ar: [phi], ma: [theta], sigma2: 1, mean: 0 }, n, createRng(5)),
    );
    const lik = new ArmaLikelihood(y, [], 1, 1);
    // u = atanh(π), and for one coefficient π is the coefficient itself.
    const f = (u1: number, u2: number): number => lik.profile([Math.tanh(u1)], [Math.tanh(u2)]);
    const u0 = [Math.atanh(phi), Math.atanh(theta)];
    const h = 1e-3;
    const H = [
      [0, 0],
      [0, 0],
    ];
    const f0 = f(u0[0], u0[1]);
    for (let i = 0; i < 2; i++) {
      const e = [i === 0 ? h : 0, i === 1 ? h : 0];
      H[i][i] = (f(u0[0] + e[0], u0[1] + e[1]) - 2 * f0 + f(u0[0] - e[0], u0[1] - e[1])) / (h * h);
    }
    H[0][1] = H[1][0] =
      (f(u0[0] + h, u0[1] + h) -
        f(u0[0] + h, u0[1] - h) -
        f(u0[0] - h, u0[1] + h) +
        f(u0[0] - h, u0[1] - h)) /
      (4 * h * h);
    const inv = new Float64Array(4);
    expect(arma11InverseInformation(Float64Array.from(u0), inv)).toBe(true);
    // inv · H ≈ identity; the sampling error of an observed Hessian is O(1/√n) ≈ 1%.
    const prod = [
      inv[0] * H[0][0] + inv[1] * H[1][0],
      inv[0] * H[0][1] + inv[1] * H[1][1],
      inv[2] * H[0][0] + inv[3] * H[1][0],
      inv[2] * H[0][1] + inv[3] * H[1][1],
    ];
    expect(Math.abs(prod[0] - 1)).toBeLessThan(0.08);
    expect(Math.abs(prod[3] - 1)).toBeLessThan(0.08);
    expect(Math.abs(prod[1])).toBeLessThan(0.08);
    expect(Math.abs(prod[2])).toBeLessThan(0.08);
  });

  it('declines near a common factor (φ = θ), where the information is singular', () => {
    const u = Float64Array.from([Math.atanh(0.5), Math.atanh(0.5)]);
    expect(arma11InverseInformation(u, new Float64Array(4))).toBe(false);
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
