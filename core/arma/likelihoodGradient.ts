/**
 * The gradient of the concentrated objective ½(log σ̂² + Σ log F / n) (kalmanLikelihood.ts) in
 * (φ, θ), by reverse-mode differentiation of the filter pass that computed it (the adjoint of each
 * recursion, run backwards over the steps the pass recorded: Griewank & Walther 2008, "Evaluating
 * Derivatives", ch. 3), for the pass of the commonest case (the mean or no regressor, r ≤ 3).
 * It costs about one more pass, where forward differences cost p + q.
 *
 * By the envelope theorem the mean at its GLS estimate β̂ can be held fixed: the objective is then
 * that of the single series z = w − β̂x, whose innovations are v_y − β̂ v_x (both columns go
 * through the same filter), so only one column is differentiated. The steps where the pass
 * switched to the steady state are those of the function differentiated (as the finite differences
 * froze them), so the gradient is exact for the function the search minimises. The initial
 * covariance P₀ = T P₀ Tᵀ + R Rᵀ moves with the parameters as dP₀ = T dP₀ Tᵀ + C with
 * C = dT P₀ Tᵀ + T P₀ dTᵀ + dR Rᵀ + R dRᵀ; its share of every parameter's derivative comes from
 * one solve of the adjoint equation S = Tᵀ S T + G (stationaryCovariance.ts).
 */
import type { ArmaLikelihood } from './kalmanLikelihood';
import { solveCompanionLyapunovAdjoint } from './stationaryCovariance';

export interface FilterTrace {
  F: Float64Array;
  k1: Float64Array;
  k2: Float64Array;
  vy: Float64Array;
  vx: Float64Array;
  /** 8 numbers per missing week: p00 p01 p02 p11 p12 p22 of the predicted covariance, a0, b0. */
  missing: Float64Array;
  /** After the last week: a0 a1 a2 b0 b1 b2 (both columns' predicted states), p00 … p22. */
  end: Float64Array;
}

/** Scratch for one likelihood's gradients (allocated once per likelihood). */
export interface GradientWorkspace {
  /** The kind of each week (MISSING, FULL, STEADY, MISSING_RESET below). */
  kind: Float64Array;
  /** The adjoint of P₀ as a symmetric matrix, and the solution of the adjoint Lyapunov equation. */
  G: Float64Array;
  S: Float64Array;
}

/** kind: n entries owned by the likelihood (allocated with its record). */
export function createGradientWorkspace(kind: Float64Array, r: number): GradientWorkspace {
  return {
    kind,
    G: new Float64Array(r * r),
    S: new Float64Array(r * r),
  };
}

const MISSING = 0;
const FULL = 1;
const STEADY = 2;
/** A missing week right after a steady stretch, where the pass restarts P at R Rᵀ. */
const MISSING_RESET = 3;

/**
 * Writes ∂objective/∂φ_i into gAr and ∂objective/∂θ_j into gMa for the parameters, β̂ and
 * switch steps of the last profile() pass, which must have been passMean3's case
 * (lik.hasGradient). False when that pass left nothing to differentiate (SSR not positive).
 */
export function likelihoodGradient(
  lik: ArmaLikelihood,
  ws: GradientWorkspace,
  gAr: Float64Array,
  gMa: Float64Array,
): boolean {
  const { n, p, q, r } = lik;
  const cols = lik.columns;
  const w = cols[0];
  const x = lik.k > 0 ? cols[1] : w;
  const b = lik.k > 0 ? lik.beta[0] : 0;
  const { phi, R } = lik.transition;
  const f0 = phi[0];
  const f1 = r > 1 ? phi[1] : 0;
  const f2 = r > 2 ? phi[2] : 0;
  const r1 = r > 1 ? R[1] : 0;
  const r2 = r > 2 ? R[2] : 0;
  const ssr = lik.ssr;
  const nobs = lik.nobs;
  if (!(ssr > 0) || !Number.isFinite(ssr) || nobs === 0) return false;
  const dS = 0.5 / ssr;
  const dL = 0.5 / nobs;
  const { F: tF, k1: tk1, k2: tk2, vy: tvy, vx: tvx, missing: tm } = lik.trace;

  // The kind of every step, as the pass took it. Without missing weeks there is at most one
  // steady stretch, from the switch step to the end; otherwise each step's kind is written out.
  const switches = lik.switches;
  const noMissing = tm.length === 0;
  const steadyFrom = noMissing && switches.length > 0 ? switches[0] : n;
  const kind = ws.kind;
  if (!noMissing) {
    let si = 0;
    let steady = false;
    for (let t = 0; t < n; t++) {
      // A switch step starts a steady stretch, which is empty when that week is missing (the pass
      // then restarts P at R Rᵀ there).
      if (si < switches.length && switches[si] === t) {
        steady = true;
        si++;
      }
      if (Number.isNaN(w[t])) {
        kind[t] = steady ? MISSING_RESET : MISSING;
        steady = false;
      } else kind[t] = steady ? STEADY : FULL;
    }
  }

  // Adjoints of the predicted state (A) and covariance (Q, one per distinct entry) of step t + 1,
  // and of φ_0..φ_2 (gf) and R_1, R_2 (gr).
  let A0 = 0;
  let A1 = 0;
  let A2 = 0;
  let Q00 = 0;
  let Q01 = 0;
  let Q02 = 0;
  let Q11 = 0;
  let Q12 = 0;
  let Q22 = 0;
  let gf0 = 0;
  let gf1 = 0;
  let gf2 = 0;
  let gr1 = 0;
  let gr2 = 0;
  for (let t = n - 1; t >= 0; t--) {
    const kd = noMissing ? (t >= steadyFrom ? STEADY : FULL) : kind[t];
    if (kd === STEADY) {
      // a0' = f0 z + a1 + r1 e, a1' = f1 z + a2 + r2 e, a2' = f2 z, e = z − a0; SSR += e².
      const zt = w[t] - b * x[t];
      const e = tvy[t] - b * tvx[t];
      gf0 += A0 * zt;
      gf1 += A1 * zt;
      gf2 += A2 * zt;
      gr1 += A0 * e;
      gr2 += A1 * e;
      const eb = A0 * r1 + A1 * r2 + 2 * dS * e;
      A2 = A1;
      A1 = A0;
      A0 = -eb;
    } else if (kd === FULL) {
      // The same with gains k = P_{·0}/F, SSR += e²/F, Σ log F += log F, and the covariance
      // P' = shift of (P − K Kᵀ F) + R Rᵀ (kalmanLikelihood.ts, passMean3).
      const F = tF[t];
      const k1 = tk1[t];
      const k2 = tk2[t];
      const p01 = k1 * F;
      const p02 = k2 * F;
      const zt = w[t] - b * x[t];
      const e = tvy[t] - b * tvx[t];
      gf0 += A0 * zt;
      gf1 += A1 * zt;
      gf2 += A2 * zt;
      const invF = 1 / F;
      const eb = A0 * k1 + A1 * k2 + 2 * dS * e * invF;
      let Fb = (dL - dS * e * e * invF) * invF;
      // p00' = pf11 + 1, p01' = pf12 + r1, p02' = r2, p11' = pf22 + r1², p12' = r1 r2, p22' = r2²;
      // pf11 = p11 − k1 p01, pf12 = p12 − k1 p02, pf22 = p22 − k2 p02.
      gr1 += Q01 + 2 * r1 * Q11 + r2 * Q12;
      gr2 += Q02 + r1 * Q12 + 2 * r2 * Q22;
      const k1b = A0 * e - Q01 * p02 - Q00 * p01;
      const k2b = A1 * e - Q11 * p02;
      const n01 = -Q00 * k1 + k1b * invF;
      const n02 = -Q11 * k2 - Q01 * k1 + k2b * invF;
      Fb -= (k1b * k1 + k2b * k2) * invF;
      Q22 = Q11;
      Q12 = Q01;
      Q11 = Q00;
      Q00 = Fb;
      Q01 = n01;
      Q02 = n02;
      A2 = A1;
      A1 = A0;
      A0 = -eb;
    } else {
      // Prediction only: a' = T a, P' = T P Tᵀ + R Rᵀ.
      const m8 = 8 * t;
      const p00 = tm[m8];
      const p01 = tm[m8 + 1];
      const p02 = tm[m8 + 2];
      const a0 = tm[m8 + 6] - b * tm[m8 + 7];
      gf0 += Q00 * (2 * f0 * p00 + 2 * p01) + Q01 * (f1 * p00 + p02) + Q02 * f2 * p00 + A0 * a0;
      gf1 += Q01 * (f0 * p00 + p01) + Q11 * (2 * f1 * p00 + 2 * p02) + Q12 * f2 * p00 + A1 * a0;
      gf2 += Q02 * (f0 * p00 + p01) + Q12 * (f1 * p00 + p02) + Q22 * 2 * f2 * p00 + A2 * a0;
      gr1 += Q01 + 2 * r1 * Q11 + r2 * Q12;
      gr2 += Q02 + r1 * Q12 + 2 * r2 * Q22;
      let n00 = f0 * (Q00 * f0 + Q01 * f1 + Q02 * f2) + f1 * (Q11 * f1 + Q12 * f2) + Q22 * f2 * f2;
      let n01 = 2 * f0 * Q00 + f1 * Q01 + f2 * Q02;
      let n02 = f0 * Q01 + 2 * f1 * Q11 + f2 * Q12;
      let n11 = Q00;
      let n12 = Q01;
      let n22 = Q11;
      const nA0 = f0 * A0 + f1 * A1 + f2 * A2;
      A2 = A1;
      A1 = A0;
      A0 = nA0;
      if (kd === MISSING_RESET) {
        // P here was R Rᵀ: its adjoint goes to R and no further back.
        gr1 += n01 + 2 * r1 * n11 + r2 * n12;
        gr2 += n02 + r1 * n12 + 2 * r2 * n22;
        n00 = 0;
        n01 = 0;
        n02 = 0;
        n11 = 0;
        n12 = 0;
        n22 = 0;
      }
      Q00 = n00;
      Q01 = n01;
      Q02 = n02;
      Q11 = n11;
      Q12 = n12;
      Q22 = n22;
    }
  }
  // The initial (stationary) covariance's share: with G the adjoint of P₀ as a symmetric matrix
  // (each off-diagonal variable stands for two entries) and S = Tᵀ S T + G, the share of a
  // parameter is ⟨S, C⟩ for its C (above): 2 (S M)_i for φ_i, −2 (S R)_m for θ_j.
  const G = ws.G;
  const S = ws.S;
  G.fill(0);
  G[0] = Q00;
  if (r > 1) {
    G[1] = G[r] = 0.5 * Q01;
    G[r + 1] = Q11;
  }
  if (r > 2) {
    G[2] = G[2 * r] = 0.5 * Q02;
    G[r + 2] = G[2 * r + 1] = 0.5 * Q12;
    G[2 * r + 2] = Q22;
  }
  if (!solveCompanionLyapunovAdjoint(phi, G, lik.lyapunovWorkspace, S)) return false;
  const P0 = lik.initialCovariance;
  for (let i = 0; i < p; i++) {
    let share = 0;
    for (let j = 0; j < r; j++) share += S[i * r + j] * (phi[j] * P0[0] + (j + 1 < r ? P0[(j + 1) * r] : 0));
    gAr[i] = (i === 0 ? gf0 : i === 1 ? gf1 : gf2) + 2 * share;
  }
  for (let j = 0; j < q; j++) {
    const m = j + 1;
    let share = 0;
    for (let i = 0; i < r; i++) share += S[m * r + i] * R[i];
    gMa[j] = -(j === 0 ? gr1 : gr2) - 2 * share;
  }
  for (let i = 0; i < p; i++) if (!Number.isFinite(gAr[i])) return false;
  for (let j = 0; j < q; j++) if (!Number.isFinite(gMa[j])) return false;
  return true;
}
