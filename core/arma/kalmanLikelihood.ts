/**
 * Exact Gaussian likelihood of a regression with ARMA(p,q) errors, w_t = x_tᵀβ + u_t, by one
 * Kalman filter on the Harvey state-space form of u (see stationaryCovariance.ts), started from
 * the stationary covariance (Gardner, Harvey & Phillips 1980, Applied Statistics 29(3)).
 * σ² is concentrated out (Harvey 1989, §3.4) and β by generalised least squares: the filter's gain
 * does not depend on the data, so the series and every regressor column (a column of ones for the
 * mean) run through the same filter together; with innovations v_y, V_X and variances σ²F_t,
 *   β̂ = (Σ V_X V_Xᵀ/F)⁻¹ Σ V_X v_y/F,   σ̂² = Σ (v_y − V_X β̂)²/F / n,
 *   log L = −½ (n log(2π σ̂²) + Σ log F_t + n),
 * which is exactly the value base R's stats::arima(method = "ML") reports. Missing values (NaN)
 * skip the update step and count in neither n nor Σ log F (Harvey 1989, §3.4.7).
 *
 * Speed: no allocation per step; on an observed week the filtered covariance has a zero first row
 * and column (the first state element is observed without noise), so T P Tᵀ is a shift of it,
 * O(r²) with no multiplication by φ (φ enters through the start and missing weeks); once the
 * filtered covariance has vanished (trace < 1e-8, which happens within a few dozen weeks for an
 * MA part away from the unit circle) the gain is constant (K = R, F = 1) and the filter switches
 * to the steady-state recursion until the next missing week.
 */

import { choleskyFactor, inverseFromCholesky } from './leastSquares';
import {
  createGradientWorkspace,
  type FilterTrace,
  type GradientWorkspace,
  likelihoodGradient,
} from './likelihoodGradient';
import {
  createLyapunovWorkspace,
  type LyapunovWorkspace,
  stationaryCovariance,
} from './stationaryCovariance';
import { float64Block, numberArray, scratchBlock } from './typedArrays';

const STEADY_TOL = 1e-8;

/** The exact filter's record of a fitted model (exactFit()). */
export interface FilterOutputs {
  innovations: Float64Array;
  variances: Float64Array;
  predictions: Float64Array;
  state: number[];
  covariance: number[];
}

export class ArmaLikelihood {
  readonly n: number;
  readonly p: number;
  readonly q: number;
  readonly r: number;
  /** Number of regressor columns (mean included). */
  readonly k: number;
  /** Column 0 is the series, columns 1..k the regressors (each length n). */
  private readonly cols: Float64Array[];
  private readonly phi: Float64Array;
  private readonly R: Float64Array;
  private readonly P: Float64Array;
  private readonly tmp: Float64Array;
  private readonly K: Float64Array;
  private readonly a: Float64Array;
  private readonly v: Float64Array;
  private readonly ws: LyapunovWorkspace;
  /** Σ V_X V_Xᵀ/F (k × k), Σ V_X v_y/F (k) and Σ v_y²/F from the last pass. */
  readonly sxx: Float64Array;
  readonly sxy: Float64Array;
  syy = 0;
  sumLogF = 0;
  nobs = 0;
  readonly beta: Float64Array;
  private readonly chol: Float64Array;
  sigma2 = Number.NaN;
  /** Likelihood evaluations (filter passes) and analytic gradients since construction. */
  evaluations = 0;
  gradients = 0;
  /** Σ v_x v_y and Σ v_x² of the last steadyMean3 call (the mean column's share). */
  private steadyCross = 0;
  private steadyX = 0;
  /**
   * What the last passMean3 recorded for the gradient (likelihoodGradient.ts), by step: F, the gains
   * k1 and k2 (full filter), the innovations of the series and of the mean column; at a missing
   * week the predicted covariance (six entries) and the two states before the prediction.
   */
  readonly trace: FilterTrace;
  /** Σ (v_y − V_X β̂)²/F of the last profile() (the concentrated SSR). */
  ssr = Number.NaN;

  constructor(w: Float64Array, xcols: Float64Array[], p: number, q: number) {
    this.n = w.length;
    this.p = p;
    this.q = q;
    const r = Math.max(p, q + 1);
    this.r = r;
    this.k = xcols.length;
    this.cols = [w, ...xcols];
    this.phi = new Float64Array(r);
    this.R = new Float64Array(r);
    this.P = new Float64Array(r * r);
    this.tmp = new Float64Array(r * r);
    this.K = new Float64Array(r);
    // Two columns at least: passMean3 runs a second (unused) column when there is no mean.
    this.a = new Float64Array(Math.max(2, this.k + 1) * r);
    this.v = new Float64Array(this.k + 1);
    this.ws = createLyapunovWorkspace(r);
    this.sxx = new Float64Array(this.k * this.k);
    this.sxy = new Float64Array(this.k);
    this.beta = new Float64Array(this.k);
    this.chol = new Float64Array(this.k * this.k);
    const n = this.n;
    let missing = 0;
    for (let t = 0; t < n; t++) if (Number.isNaN(w[t])) missing = 8 * n;
    // Scratch inside a fit's scope (fitArma), where the likelihood dies with the fit; everything the
    // likelihood keeps is taken here, so it all lives exactly as long as the likelihood. A pass
    // switches at most once per week: n + 1 entries hold every switch step.
    const [F, k1, k2, vy, vx, missingRecord, end, switchLog, frozenLog, weekKinds] = scratchBlock([
      n,
      n,
      n,
      n,
      n,
      missing,
      12,
      n + 1,
      n + 1,
      n,
    ]);
    this.trace = { F, k1, k2, vy, vx, missing: missingRecord, end };
    this.switchLog = switchLog;
    this.frozenLog = frozenLog;
    this.weekKinds = weekKinds;
  }

  /** The switch steps of the last pass (the starts of its steady-state stretches). */
  get switches(): Float64Array {
    return this.switchLog.subarray(0, this.switchCount);
  }

  /** φ (length r, zero-padded) and R = (1, −θ_1, …) of the last load. */
  get transition(): { phi: Float64Array; R: Float64Array } {
    return { phi: this.phi, R: this.R };
  }

  get columns(): Float64Array[] {
    return this.cols;
  }

  get lyapunovWorkspace(): LyapunovWorkspace {
    return this.ws;
  }

  /** The stationary covariance P₀ of the last load (passMean3 leaves it in place). */
  get initialCovariance(): Float64Array {
    return this.P;
  }

  private gradientWs: GradientWorkspace | null = null;
  /** The gradient's kind of each week (likelihoodGradient.ts), allocated with the record. */
  private readonly weekKinds: Float64Array;

  /**
   * ∂/∂φ and ∂/∂θ of profile() at the parameters of the last profile() call, which must be the
   * last pass (likelihoodGradient.ts); false when !hasGradient or nothing to differentiate.
   */
  gradient(gAr: Float64Array, gMa: Float64Array): boolean {
    if (!this.hasGradient) return false;
    this.gradientWs ??= createGradientWorkspace(this.weekKinds, this.r);
    this.gradients++;
    return likelihoodGradient(this, this.gradientWs, gAr, gMa);
  }

  /** True when the analytic gradient (likelihoodGradient.ts) covers this model: passMean3's case. */
  get hasGradient(): boolean {
    return this.k <= 1 && this.r <= 3;
  }

  /** Loads φ and θ (ma-minus) and the stationary initial covariance; false if not stationary. */
  private load(ar: ArrayLike<number>, ma: ArrayLike<number>): boolean {
    const r = this.r;
    this.phi.fill(0);
    this.R.fill(0);
    this.R[0] = 1;
    for (let i = 0; i < this.p; i++) this.phi[i] = ar[i];
    for (let j = 0; j < this.q; j++) this.R[j + 1] = -ma[j];
    const ok = stationaryCovariance(this.phi, this.R, this.p === 0, this.ws, this.P);
    if (!ok) return false;
    for (let i = 0; i < r * r; i++) if (!Number.isFinite(this.P[i])) return false;
    return true;
  }

  /** P ← T P Tᵀ + R Rᵀ using the companion structure of T. */
  private predictCovariance(): void {
    const r = this.r;
    const P = this.P;
    const M = this.tmp;
    const phi = this.phi;
    const R = this.R;
    for (let i = 0; i < r; i++) {
      const fi = phi[i];
      for (let j = 0; j < r; j++) M[i * r + j] = fi * P[j] + (i + 1 < r ? P[(i + 1) * r + j] : 0);
    }
    for (let i = 0; i < r; i++) {
      const m0 = M[i * r];
      for (let j = i; j < r; j++) {
        const val = m0 * phi[j] + (j + 1 < r ? M[i * r + j + 1] : 0) + R[i] * R[j];
        P[i * r + j] = val;
        P[j * r + i] = val;
      }
    }
  }

  /**
   * Steps at which the last pass entered the steady state (once, or again after each missing
   * week). freezeSwitches() makes the following passes switch exactly there, so that the
   * finite-difference stencil of a gradient or Hessian sees one smooth function rather than one
   * with small jumps where a switch step moves; disableSteadyState() never switches (exact likelihood).
   */
  private switchLog: Float64Array;
  private switchCount = 0;
  private frozenLog: Float64Array;
  private frozenCount = 0;
  /** 0: switch on the trace test; 1: replay the frozen steps; 2: never switch. */
  private switchMode = 0;

  freezeSwitches(): void {
    this.frozenLog.set(this.switchLog.subarray(0, this.switchCount));
    this.frozenCount = this.switchCount;
    this.switchMode = 1;
  }

  releaseSwitches(): void {
    this.switchMode = 0;
  }

  disableSteadyState(): void {
    this.switchMode = 2;
  }

  /**
   * One filter pass accumulating the GLS sums. Returns false if a prediction variance is not
   * positive (numerically singular model).
   */
  private pass(): boolean {
    this.evaluations++;
    if (this.k <= 1 && this.r <= 3) return this.passMean3();
    const n = this.n;
    const r = this.r;
    const k = this.k;
    const nc = k + 1;
    const cols = this.cols;
    const phi = this.phi;
    const R = this.R;
    const P = this.P;
    const K = this.K;
    const a = this.a;
    const v = this.v;
    const sxx = this.sxx;
    const sxy = this.sxy;
    sxx.fill(0);
    sxy.fill(0);
    a.fill(0);
    let syy = 0;
    let sumLogF = 0;
    let nobs = 0;
    const w = cols[0];
    const mode = this.switchMode;
    const log = this.switchLog;
    const frozen = this.frozenLog;
    const frozenCount = this.frozenCount;
    const Rlast = R[r - 1];
    let switches = 0;
    let fi = 0;
    let t = 0;
    while (t < n) {
      if (!Number.isNaN(w[t])) {
        const F = P[0];
        if (!(F > 1e-300)) return false;
        const invF = 1 / F;
        for (let i = 0; i < r; i++) K[i] = P[i * r] * invF;
        // a_{t+1|t} = T (a + K v): the filtered first element is the observation itself, so
        // element i is φ_i x_t + a_{i+1} + K_{i+1} v.
        for (let c = 0; c < nc; c++) {
          const base = c * r;
          const xt = cols[c][t];
          const vc = xt - a[base];
          v[c] = vc;
          for (let i = 0; i < r - 1; i++) a[base + i] = phi[i] * xt + a[base + i + 1] + K[i + 1] * vc;
          a[base + r - 1] = phi[r - 1] * xt;
        }
        const vy = v[0];
        syy += vy * vy * invF;
        for (let i = 0; i < k; i++) {
          const vi = v[i + 1] * invF;
          sxy[i] += vi * vy;
          for (let j = 0; j <= i; j++) sxx[i * k + j] += vi * v[j + 1];
        }
        sumLogF += Math.log(F);
        nobs++;
        // P_{t+1|t} = T P_{t|t} Tᵀ + R Rᵀ. The first row and column of P_{t|t} = P − K Kᵀ F vanish
        // (the first state element is observed without noise), so T P_{t|t} Tᵀ is P_{t|t} shifted
        // up and left by one and φ does not enter. In place: each write lands on an entry already
        // read (upper triangle) or never read (lower triangle); the gain K is saved.
        let trace = 0;
        for (let i = 1; i < r; i++) {
          const kiF = K[i] * F;
          const Ri = R[i - 1];
          const pf = P[i * r + i] - kiF * K[i];
          trace += pf;
          P[(i - 1) * r + i - 1] = pf + Ri * Ri;
          for (let j = i + 1; j < r; j++) {
            const val = P[i * r + j] - kiF * K[j] + Ri * R[j - 1];
            P[(i - 1) * r + j - 1] = val;
            P[(j - 1) * r + i - 1] = val;
          }
        }
        for (let i = 0; i < r; i++) {
          const val = R[i] * Rlast;
          P[i * r + r - 1] = val;
          P[(r - 1) * r + i] = val;
        }
        t++;
        let enter = false;
        if (mode === 0) enter = trace < STEADY_TOL;
        else if (mode === 1) {
          while (fi < frozenCount && frozen[fi] < t) fi++;
          enter = fi < frozenCount && frozen[fi] === t;
        }
        if (enter) {
          // P_{t|t} ≈ 0 from here: gain R, F = 1, until the next missing week.
          log[switches++] = t;
          this.syy = syy;
          const t1 = nc === 2 ? this.steadyMean(t) : this.steadyGeneric(t);
          syy = this.syy;
          nobs += t1 - t;
          t = t1;
          if (t < n) {
            // A missing week ends the steady state: P_{t|t−1} = R Rᵀ there.
            for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) P[i * r + j] = R[i] * R[j];
          }
        }
      } else {
        for (let c = 0; c < nc; c++) {
          const base = c * r;
          const a0 = a[base];
          for (let i = 0; i < r - 1; i++) a[base + i] = phi[i] * a0 + a[base + i + 1];
          a[base + r - 1] = phi[r - 1] * a0;
        }
        this.predictCovariance();
        t++;
      }
    }
    this.syy = syy;
    this.sumLogF = sumLogF;
    this.nobs = nobs;
    this.switchCount = switches;
    return true;
  }

  /**
   * pass() for the commonest case — one regressor (the mean), r ≤ 3 (p ≤ 3, q ≤ 2), no missing
   * week — with the state and the upper triangle of P in local variables. The same recursions as
   * pass(); entries past r stay zero because their φ and R are zero.
   */
  private passMean3(): boolean {
    const n = this.n;
    const r = this.r;
    const phi = this.phi;
    const R = this.R;
    const P = this.P;
    const w = this.cols[0];
    // Without a mean (k = 0) the second column is the series again; its sums are not used.
    const x = this.k > 0 ? this.cols[1] : w;
    const f0 = phi[0];
    const f1 = r > 1 ? phi[1] : 0;
    const f2 = r > 2 ? phi[2] : 0;
    const r1 = r > 1 ? R[1] : 0;
    const r2 = r > 2 ? R[2] : 0;
    let p00 = P[0];
    let p01 = r > 1 ? P[1] : 0;
    let p02 = r > 2 ? P[2] : 0;
    let p11 = r > 1 ? P[r + 1] : 0;
    let p12 = r > 2 ? P[r + 2] : 0;
    let p22 = r > 2 ? P[2 * r + 2] : 0;
    let a0 = 0;
    let a1 = 0;
    let a2 = 0;
    let b0 = 0;
    let b1 = 0;
    let b2 = 0;
    let syy = 0;
    let sxy = 0;
    let sxx = 0;
    let sumLogF = 0;
    // Σ log F as the log of a running product, flushed before it can overflow or underflow
    // (F ≥ 1 here in exact arithmetic: the innovation variance includes σ² = 1): one log per
    // block of steps instead of one per step.
    let prodF = 1;
    const tF = this.trace.F;
    const tk1 = this.trace.k1;
    const tk2 = this.trace.k2;
    const tvy = this.trace.vy;
    const tvx = this.trace.vx;
    const tm = this.trace.missing;
    const mode = this.switchMode;
    const frozen = this.frozenLog;
    const frozenCount = this.frozenCount;
    let switches = 0;
    let fi = 0;
    let t = 0;
    let nobs = 0;
    while (t < n) {
      const wt = w[t];
      if (Number.isNaN(wt)) {
        // A missing week: prediction only, a ← T a and P ← T P Tᵀ + R Rᵀ (φ enters here).
        const m8 = 8 * t;
        tm[m8] = p00;
        tm[m8 + 1] = p01;
        tm[m8 + 2] = p02;
        tm[m8 + 3] = p11;
        tm[m8 + 4] = p12;
        tm[m8 + 5] = p22;
        tm[m8 + 6] = a0;
        tm[m8 + 7] = b0;
        const na0 = f0 * a0 + a1;
        const na1 = f1 * a0 + a2;
        a2 = f2 * a0;
        a0 = na0;
        a1 = na1;
        const nb0 = f0 * b0 + b1;
        const nb1 = f1 * b0 + b2;
        b2 = f2 * b0;
        b0 = nb0;
        b1 = nb1;
        const q00 = f0 * f0 * p00 + 2 * f0 * p01 + p11 + 1;
        const q01 = f0 * f1 * p00 + f0 * p02 + f1 * p01 + p12 + r1;
        const q02 = f0 * f2 * p00 + f2 * p01 + r2;
        const q11 = f1 * f1 * p00 + 2 * f1 * p02 + p22 + r1 * r1;
        const q12 = f1 * f2 * p00 + f2 * p02 + r1 * r2;
        const q22 = f2 * f2 * p00 + r2 * r2;
        p00 = q00;
        p01 = q01;
        p02 = q02;
        p11 = q11;
        p12 = q12;
        p22 = q22;
        t++;
        continue;
      }
      nobs++;
      const F = p00;
      if (!(F > 1e-300)) return false;
      const invF = 1 / F;
      const k1 = p01 * invF;
      const k2 = p02 * invF;
      const xt = x[t];
      const vy = wt - a0;
      const vx = xt - b0;
      tF[t] = F;
      tk1[t] = k1;
      tk2[t] = k2;
      tvy[t] = vy;
      tvx[t] = vx;
      a0 = f0 * wt + a1 + k1 * vy;
      a1 = f1 * wt + a2 + k2 * vy;
      a2 = f2 * wt;
      b0 = f0 * xt + b1 + k1 * vx;
      b1 = f1 * xt + b2 + k2 * vx;
      b2 = f2 * xt;
      syy += vy * vy * invF;
      sxy += vx * vy * invF;
      sxx += vx * vx * invF;
      prodF *= F;
      if (prodF > 1e150 || prodF < 1e-150) {
        sumLogF += Math.log(prodF);
        prodF = 1;
      }
      // P_{t|t} rows 1.., then the shift: P_{t+1|t}(i, j) = P_{t|t}(i+1, j+1) + R_i R_j.
      const pf11 = p11 - k1 * p01;
      const pf12 = p12 - k1 * p02;
      const pf22 = p22 - k2 * p02;
      p00 = pf11 + 1;
      p01 = pf12 + r1;
      p02 = r2;
      p11 = pf22 + r1 * r1;
      p12 = r1 * r2;
      p22 = r2 * r2;
      t++;
      let enter = false;
      if (mode === 0) enter = pf11 + pf22 < STEADY_TOL;
      else if (mode === 1) {
        while (fi < frozenCount && frozen[fi] < t) fi++;
        enter = fi < frozenCount && frozen[fi] === t;
      }
      if (enter && t < n) {
        this.switchLog[switches++] = t;
        const a = this.a;
        this.storeState3(a0, a1, a2, b0, b1, b2);
        this.syy = 0;
        this.steadyCross = 0;
        this.steadyX = 0;
        const t1 = this.steadyMean3(t);
        syy += this.syy;
        sxy += this.steadyCross;
        sxx += this.steadyX;
        nobs += t1 - t;
        t = t1;
        if (t < n) {
          // A missing week ends the steady state: P_{t|t−1} = R Rᵀ there.
          a0 = a[0];
          b0 = a[r];
          a1 = r > 1 ? a[1] : 0;
          b1 = r > 1 ? a[r + 1] : 0;
          a2 = r > 2 ? a[2] : 0;
          b2 = r > 2 ? a[r + 2] : 0;
          p00 = 1;
          p01 = r1;
          p02 = r2;
          p11 = r1 * r1;
          p12 = r1 * r2;
          p22 = r2 * r2;
        }
      }
    }
    this.syy = syy;
    if (this.k > 0) {
      this.sxy[0] = sxy;
      this.sxx[0] = sxx;
    }
    this.sumLogF = sumLogF + Math.log(prodF);
    this.nobs = nobs;
    this.switchCount = switches;
    // The predicted state of both columns and the covariance after the last week (what an exact
    // pass ends on; after a steady stretch that ran to the end they are not kept).
    const e = this.trace.end;
    e[0] = a0;
    e[1] = a1;
    e[2] = a2;
    e[3] = b0;
    e[4] = b1;
    e[5] = b2;
    e[6] = p00;
    e[7] = p01;
    e[8] = p02;
    e[9] = p11;
    e[10] = p12;
    e[11] = p22;
    return true;
  }

  /** Steady-state recursion a ← T(a + R v) for the series and one regressor, from step t0. */
  private steadyMean(t0: number): number {
    if (this.r <= 3) {
      const t1 = this.steadyMean3(t0);
      this.sxy[0] += this.steadyCross;
      this.sxx[0] += this.steadyX;
      return t1;
    }
    const { n, r, phi, R, a, cols } = this;
    const w = cols[0];
    const x = cols[1];
    let syy = 0;
    let sxy = 0;
    let sxx = 0;
    let t = t0;
    for (; t < n; t++) {
      const wt = w[t];
      if (Number.isNaN(wt)) break;
      const xt = x[t];
      const vy = wt - a[0];
      const vx = xt - a[r];
      for (let i = 0; i < r - 1; i++) {
        a[i] = phi[i] * wt + a[i + 1] + R[i + 1] * vy;
        a[r + i] = phi[i] * xt + a[r + i + 1] + R[i + 1] * vx;
      }
      a[r - 1] = phi[r - 1] * wt;
      a[2 * r - 1] = phi[r - 1] * xt;
      syy += vy * vy;
      sxy += vx * vy;
      sxx += vx * vx;
    }
    this.syy += syy;
    this.sxy[0] += sxy;
    this.sxx[0] += sxx;
    return t;
  }

  /**
   * steadyMean for r ≤ 3 with the state in local variables (kept in registers): the states past r
   * stay zero because their φ and R are zero.
   */
  private steadyMean3(t0: number): number {
    const { n, r, phi, R, a, cols } = this;
    const w = cols[0];
    const x = this.k > 0 ? cols[1] : w;
    const f0 = phi[0];
    const f1 = r > 1 ? phi[1] : 0;
    const f2 = r > 2 ? phi[2] : 0;
    const r1 = r > 1 ? R[1] : 0;
    const r2 = r > 2 ? R[2] : 0;
    let a0 = a[0];
    let a1 = r > 1 ? a[1] : 0;
    let a2 = r > 2 ? a[2] : 0;
    let b0 = a[r];
    let b1 = r > 1 ? a[r + 1] : 0;
    let b2 = r > 2 ? a[r + 2] : 0;
    let syy = 0;
    let sxy = 0;
    let sxx = 0;
    const tvy = this.trace.vy;
    const tvx = this.trace.vx;
    let t = t0;
    for (; t < n; t++) {
      const wt = w[t];
      if (Number.isNaN(wt)) break;
      const xt = x[t];
      const vy = wt - a0;
      const vx = xt - b0;
      tvy[t] = vy;
      tvx[t] = vx;
      a0 = f0 * wt + a1 + r1 * vy;
      a1 = f1 * wt + a2 + r2 * vy;
      a2 = f2 * wt;
      b0 = f0 * xt + b1 + r1 * vx;
      b1 = f1 * xt + b2 + r2 * vx;
      b2 = f2 * xt;
      syy += vy * vy;
      sxy += vx * vy;
      sxx += vx * vx;
    }
    this.storeState3(a0, a1, a2, b0, b1, b2);
    this.syy += syy;
    this.steadyCross = sxy;
    this.steadyX = sxx;
    return t;
  }

  /** The series' and the mean column's states (r ≤ 3, kept in locals by the passes) into a. */
  private storeState3(a0: number, a1: number, a2: number, b0: number, b1: number, b2: number): void {
    const { a, r } = this;
    a[0] = a0;
    a[r] = b0;
    if (r > 1) {
      a[1] = a1;
      a[r + 1] = b1;
    }
    if (r > 2) {
      a[2] = a2;
      a[r + 2] = b2;
    }
  }

  /** Steady-state recursion for any number of columns, from step t0. */
  private steadyGeneric(t0: number): number {
    const { n, r, phi, R, a, v, cols } = this;
    const nc = this.k + 1;
    const k = this.k;
    const w = cols[0];
    let t = t0;
    for (; t < n; t++) {
      if (Number.isNaN(w[t])) break;
      for (let c = 0; c < nc; c++) {
        const base = c * r;
        const xt = cols[c][t];
        const vc = xt - a[base];
        v[c] = vc;
        for (let i = 0; i < r - 1; i++) a[base + i] = phi[i] * xt + a[base + i + 1] + R[i + 1] * vc;
        a[base + r - 1] = phi[r - 1] * xt;
      }
      const vy = v[0];
      this.syy += vy * vy;
      for (let i = 0; i < k; i++) {
        const vi = v[i + 1];
        this.sxy[i] += vi * vy;
        for (let j = 0; j <= i; j++) this.sxx[i * k + j] += vi * v[j + 1];
      }
    }
    return t;
  }

  /** Cholesky of sxx (lower triangle filled) into chol; false if not positive definite. */
  private factor(): boolean {
    return choleskyFactor(this.sxx, this.k, this.chol, 1e-300, 1);
  }

  /**
   * Concentrated objective ½(log σ̂² + Σ log F / n) with β by GLS (base R's armafn scale);
   * Infinity where the parameters are not admissible. Leaves β̂ in `beta`, σ̂² in `sigma2`.
   */
  profile(ar: ArrayLike<number>, ma: ArrayLike<number>): number {
    if (!this.load(ar, ma) || !this.pass()) return Number.POSITIVE_INFINITY;
    const k = this.k;
    let ssr = this.syy;
    this.ssr = ssr;
    if (k > 0) {
      if (!this.factor()) return Number.POSITIVE_INFINITY;
      const L = this.chol;
      const b = this.beta;
      // Solve L z = sxy, Lᵀ β = z.
      for (let i = 0; i < k; i++) {
        let s = this.sxy[i];
        for (let m = 0; m < i; m++) s -= L[i * k + m] * b[m];
        b[i] = s / L[i * k + i];
      }
      for (let i = 0; i < k; i++) ssr -= b[i] * b[i];
      this.ssr = ssr;
      for (let i = k - 1; i >= 0; i--) {
        let s = b[i];
        for (let m = i + 1; m < k; m++) s -= L[m * k + i] * b[m];
        b[i] = s / L[i * k + i];
      }
    }
    return this.finish(ssr);
  }

  /** Concentrated objective with β fixed (for the Hessian in the natural parameters). */
  fixed(ar: ArrayLike<number>, ma: ArrayLike<number>, beta: ArrayLike<number>): number {
    if (!this.load(ar, ma) || !this.pass()) return Number.POSITIVE_INFINITY;
    const k = this.k;
    let ssr = this.syy;
    for (let i = 0; i < k; i++) {
      ssr -= 2 * beta[i] * this.sxy[i];
      for (let j = 0; j < k; j++) {
        const sij = i >= j ? this.sxx[i * k + j] : this.sxx[j * k + i];
        ssr += beta[i] * sij * beta[j];
      }
    }
    return this.finish(ssr);
  }

  /** ∂objective/∂β at β (u scale) from the last pass: (Σ V_X V_Xᵀ/F · β − Σ V_X v_y/F) / SSR(β). */
  gradientBeta(beta: ArrayLike<number>, out: Float64Array): void {
    const k = this.k;
    let ssr = this.syy;
    for (let i = 0; i < k; i++) {
      let s = -this.sxy[i];
      for (let j = 0; j < k; j++) s += (i >= j ? this.sxx[i * k + j] : this.sxx[j * k + i]) * beta[j];
      out[i] = s;
      ssr += beta[i] * (s - this.sxy[i]);
    }
    for (let i = 0; i < k; i++) out[i] /= ssr;
  }

  private finish(ssr: number): number {
    const nobs = this.nobs;
    if (nobs === 0) return Number.POSITIVE_INFINITY;
    // Guard against cancellation when the fit is (numerically) exact.
    const s2 = ssr / nobs;
    this.sigma2 = s2;
    if (!(s2 > 0) || !Number.isFinite(s2)) return Number.POSITIVE_INFINITY;
    return 0.5 * (Math.log(s2) + this.sumLogF / nobs);
  }

  /** Exact log-likelihood for an objective value from profile()/fixed(). */
  loglikFromObjective(objective: number): number {
    const n = this.nobs;
    return -0.5 * (2 * n * objective + n + n * Math.log(2 * Math.PI));
  }

  /** (Σ V_X V_Xᵀ/F)⁻¹ from the last pass (k × k, row-major): the GLS covariance over σ². */
  glsInverse(): Float64Array | null {
    const k = this.k;
    if (k === 0 || !this.factor()) return k === 0 ? new Float64Array(0) : null;
    const inv = new Float64Array(k * k);
    inverseFromCholesky(this.chol, k, inv);
    return inv;
  }

  /**
   * The fitted model's exact figures at (ar, ma), from one exact pass (no steady-state shortcut):
   * the objective with β by GLS (as profile() gives it), β̂ and σ̂², and the filter's outputs on
   * u = w − Xβ̂: innovations, their variances (over σ²), one-step predictions of w, and the final
   * predicted state and covariance. In passMean3's case (hasGradient) the outputs are read from that
   * pass's record: the innovations of the two columns do not depend on β, so those of u are
   * v_y − β v_x; the predictions of w are w − innovation (on a missing week a₀ + β(x − b₀)); the
   * variances are F. Otherwise they come from fullFilter(), a second pass. Null when the parameters
   * are not admissible.
   */
  exactFit(
    ar: ArrayLike<number>,
    ma: ArrayLike<number>,
  ): { value: number; beta: number[]; sigma2: number; outputs: FilterOutputs | null } | null {
    const mode = this.switchMode;
    this.switchMode = 2;
    const value = this.profile(ar, ma);
    this.switchMode = mode;
    if (!Number.isFinite(value)) return null;
    const beta = numberArray(this.beta);
    const sigma2 = this.sigma2;
    const outputs = this.hasGradient ? this.outputsFromRecord(beta) : this.fullFilter(ar, ma, beta);
    return { value, beta, sigma2, outputs };
  }

  /** exactFit()'s outputs at β from the record of the last passMean3 pass, which was exact. */
  private outputsFromRecord(beta: ArrayLike<number>): FilterOutputs {
    const { n, r, trace } = this;
    const w = this.cols[0];
    const x = this.k > 0 ? this.cols[1] : w;
    const b = this.k > 0 ? beta[0] : 0;
    // Scratch inside a fit's scope: fitArma reads these into its own outputs.
    const [innovations, variances, predictions] = scratchBlock([n, n, n]);
    innovations.fill(Number.NaN);
    variances.fill(Number.NaN);
    for (let t = 0; t < n; t++) {
      if (Number.isNaN(w[t])) {
        const m8 = 8 * t;
        predictions[t] =
          this.k > 0 ? trace.missing[m8 + 6] + b * (x[t] - trace.missing[m8 + 7]) : trace.missing[m8 + 6];
        continue;
      }
      const e = trace.vy[t] - b * trace.vx[t];
      innovations[t] = e;
      variances[t] = trace.F[t];
      predictions[t] = w[t] - e;
    }
    const end = trace.end;
    const state: number[] = [];
    for (let i = 0; i < r; i++) state.push(end[i] - b * end[3 + i]);
    // end[6..11] = p00 p01 p02 p11 p12 p22: the r × r corner, row-major.
    const idx = [
      [6, 7, 8],
      [7, 9, 10],
      [8, 10, 11],
    ];
    const covariance: number[] = [];
    for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) covariance.push(end[idx[i][j]]);
    return { innovations, variances, predictions, state, covariance };
  }

  /**
   * The dense textbook recursion (Harvey 1989, §3.2) for exactFit(), with no shortcut: what every
   * model outside passMean3's case uses, and the tests' independent reference for the passes.
   */
  fullFilter(ar: ArrayLike<number>, ma: ArrayLike<number>, beta: ArrayLike<number>): FilterOutputs | null {
    if (!this.load(ar, ma)) return null;
    const { n, r, cols, phi, P, k } = this;
    const [innovations, variances, predictions] = float64Block([n, n, n]);
    innovations.fill(Number.NaN);
    variances.fill(Number.NaN);
    predictions.fill(Number.NaN);
    const a = new Float64Array(r);
    const Kc = new Float64Array(r);
    for (let t = 0; t < n; t++) {
      let xb = 0;
      for (let i = 0; i < k; i++) xb += beta[i] * cols[i + 1][t];
      predictions[t] = a[0] + xb;
      const wt = cols[0][t];
      if (!Number.isNaN(wt)) {
        const F = P[0];
        if (!(F > 0)) return null;
        const vt = wt - xb - a[0];
        innovations[t] = vt;
        variances[t] = F;
        for (let i = 0; i < r; i++) Kc[i] = P[i * r] / F;
        for (let i = 0; i < r; i++) a[i] += Kc[i] * vt;
        for (let i = 0; i < r; i++) {
          for (let j = i; j < r; j++) {
            const val = P[i * r + j] - Kc[i] * F * Kc[j];
            P[i * r + j] = val;
            if (j !== i) P[j * r + i] = val;
          }
        }
      }
      const a0 = a[0];
      for (let i = 0; i < r - 1; i++) a[i] = phi[i] * a0 + a[i + 1];
      a[r - 1] = phi[r - 1] * a0;
      this.predictCovariance();
    }
    return { innovations, variances, predictions, state: Array.from(a), covariance: Array.from(P) };
  }
}
