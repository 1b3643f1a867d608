/**
 * The stationary state covariance (core/arma/stationaryCovariance.ts) against its definition, the
 * discrete Lyapunov equation P = T P Tᵀ + R Rᵀ for the Harvey (1989, §3.3) companion form, and the
 * textbook AR(1) variance 1/(1 − φ²).
 */
import { describe, expect, it } from 'vitest';
import {
  createLyapunovWorkspace,
  solveCompanionLyapunov,
  solveCompanionLyapunovAdjoint,
  stationaryCovariance,
} from '../../../core/arma/stationaryCovariance';

function residual(phi: Float64Array, R: Float64Array, P: Float64Array): number {
  const r = phi.length;
  let worst = 0;
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < r; j++) {
      // (T P Tᵀ)_ij with T = [φ | shifted identity].
      let v = phi[i] * phi[j] * P[0] + R[i] * R[j];
      if (j + 1 < r) v += phi[i] * P[j + 1];
      if (i + 1 < r) v += phi[j] * P[(i + 1) * r];
      if (i + 1 < r && j + 1 < r) v += P[(i + 1) * r + j + 1];
      worst = Math.max(worst, Math.abs(v - P[i * r + j]) / Math.max(1, Math.abs(P[i * r + j])));
    }
  }
  return worst;
}

describe('stationary covariance of the ARMA state', () => {
  it('AR(1): P = 1/(1 − φ²) (textbook definition)', () => {
    const P = new Float64Array(1);
    expect(
      stationaryCovariance(
        Float64Array.from([0.8]),
        Float64Array.from([1]),
        false,
        createLyapunovWorkspace(1),
        P,
      ),
    ).toBe(true);
    expect(P[0]).toBeCloseTo(1 / (1 - 0.64), 12);
  });
  it('solves the Lyapunov equation for every state dimension up to 6', () => {
    const cases: [number[], number[]][] = [
      [
        [0.5, 0.2],
        [1, -0.4],
      ],
      [
        [0.5, 0.2, 0],
        [1, -0.4, 0.3],
      ],
      [
        [1.2, -0.5, 0.1, 0],
        [1, 0.3, 0.2, -0.1],
      ],
      [
        [0.3, 0.1, 0.1, 0.05, 0.02],
        [1, 0.5, 0.4, 0.3, 0.2],
      ],
      [
        [0.2, 0.1, 0, 0, 0, 0],
        [1, 0.5, -0.4, 0.3, -0.2, 0.1],
      ],
      [
        [0.99, 0, 0],
        [1, -0.9, 0.1],
      ],
    ];
    for (const [phiA, RA] of cases) {
      const r = phiA.length;
      const phi = Float64Array.from(phiA);
      const R = Float64Array.from(RA);
      const P = new Float64Array(r * r);
      expect(stationaryCovariance(phi, R, false, createLyapunovWorkspace(r), P)).toBe(true);
      expect(residual(phi, R, P)).toBeLessThan(1e-10);
    }
  });
  it('reports a unit root (φ = 1) as not stationary', () => {
    const P = new Float64Array(4);
    const ok = stationaryCovariance(
      Float64Array.from([1, 0]),
      Float64Array.from([1, 0.5]),
      false,
      createLyapunovWorkspace(2),
      P,
    );
    expect(ok).toBe(false);
  });
  it('the adjoint equation S = Tᵀ S T + G satisfies ⟨G, X⟩ = ⟨S, C⟩ for X = T X Tᵀ + C (its definition)', () => {
    for (const phiA of [[0.6], [0.5, 0.2], [0.3, 0.2, -0.1], [0.1, -0.2, 0.3, 0.1, 0.05]]) {
      const r = phiA.length;
      const phi = Float64Array.from(phiA);
      const sym = (seed: number): Float64Array => {
        const m = new Float64Array(r * r);
        for (let i = 0; i < r; i++) {
          for (let j = i; j < r; j++) m[i * r + j] = m[j * r + i] = Math.sin(seed + 3 * i + 7 * j);
        }
        return m;
      };
      const C = sym(1);
      const G = sym(2);
      const X = new Float64Array(r * r);
      const S = new Float64Array(r * r);
      expect(solveCompanionLyapunov(phi, C, createLyapunovWorkspace(r), X)).toBe(true);
      expect(solveCompanionLyapunovAdjoint(phi, G, createLyapunovWorkspace(r), S)).toBe(true);
      let gx = 0;
      let sc = 0;
      for (let i = 0; i < r * r; i++) {
        gx += G[i] * X[i];
        sc += S[i] * C[i];
      }
      expect(Math.abs(gx - sc)).toBeLessThan(1e-10 * Math.max(1, Math.abs(gx)));
    }
  });
});
