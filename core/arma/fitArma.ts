/**
 * Exact maximum-likelihood fit of an ARIMA(p,d,q) model, optionally with a mean and regressors
 * (a regression with ARMA errors on the d-th difference):
 *   - likelihood: one Kalman filter (kalmanLikelihood.ts), σ², the mean and the regressor
 *     coefficients concentrated out (σ² analytically, the rest by GLS through the same filter);
 *   - parameters: AR and MA polynomials through their partial autocorrelations, π = tanh(u)
 *     (Jones 1980; Monahan 1984), so BFGS works unconstrained and every iterate is stationary and
 *     invertible;
 *   - starts: Hannan–Rissanen (1982) and zero, plus the pure-AR and pure-MA corners; the best
 *     optimum is kept (the ARMA(2,2) likelihood is often bimodal);
 *   - standard errors: inverse of the numerical Hessian of −log L in the natural parameters
 *     (φ, θ, mean, β), σ² concentrated, as base R's stats::arima computes them.
 * Awkward series never throw: they return a fallback (the mean, or the last value) with flags.
 */
import { difference, integrationWeights } from './difference';
import type { ArmaLikelihood } from './kalmanLikelihood';
import { solveNormalEquations } from './leastSquares';
import { searchOptimum } from './searchOptimum';
import { float64Block, numberArray, scratchBlock, withScratch } from './typedArrays';
import type { ArmaFit, ArmaFitOptions } from './types';

/** The δ tried, in turn, when the search's optimum has no exact likelihood (see fitScratched). */
const EDGE_STEPS = [1e-8, 1e-6, 1e-4, 1e-2];

/** The coefficients of 1 − Σ c_i ((1 − δ) z)^i: the same polynomial with roots 1/(1 − δ) farther out. */
function rootsMovedOutward(coef: number[], delta: number): number[] {
  let f = 1;
  return coef.map((c) => {
    f *= 1 - delta;
    return c * f;
  });
}

const MAX_P = 5;
const MAX_Q = 5;
const MAX_D = 2;

function checkOrder(opts: ArmaFitOptions): void {
  const { p, d, q } = opts;
  for (const [name, v, max] of [
    ['p', p, MAX_P],
    ['d', d, MAX_D],
    ['q', q, MAX_Q],
  ] as const) {
    if (!Number.isInteger(v) || v < 0 || v > max) {
      throw new RangeError(`ARMA order ${name} = ${v} is not an integer between 0 and ${max}`);
    }
  }
}

interface Prepared {
  n: number;
  y: Float64Array;
  w: Float64Array;
  xcols: Float64Array[];
  nobs: number;
  flags: string[];
  /** n zeros for fitArma's scaled deviations (allocated with the rest). */
  u: Float64Array;
}

function prepare(y: ArrayLike<number>, opts: ArmaFitOptions, includeMean: boolean): Prepared {
  const n = y.length;
  const flags: string[] = [];
  // Scratch: these die with the fit (the likelihood's columns among them).
  const [yc, w0, ones, u] = scratchBlock([n, opts.d === 0 ? n : 0, includeMean ? n : 0, n]);
  let nonFinite = false;
  for (let t = 0; t < n; t++) {
    const v = Number(y[t]);
    if (Number.isNaN(v)) yc[t] = Number.NaN;
    else if (!Number.isFinite(v)) {
      yc[t] = Number.NaN;
      nonFinite = true;
    } else yc[t] = v;
  }
  let w = w0;
  if (opts.d === 0) w.set(yc);
  else w = difference(yc, opts.d);
  const xcols: Float64Array[] = [];
  if (includeMean) xcols.push(ones.fill(1));
  for (const [i, col] of (opts.xreg ?? []).entries()) {
    if (col.length !== n) {
      throw new RangeError(`regressor column ${i} has length ${col.length}, the series ${n}`);
    }
    const xc = difference(col, opts.d);
    for (let t = 0; t < n; t++) {
      if (!Number.isFinite(xc[t]) && !Number.isNaN(w[t])) {
        if (t >= opts.d) nonFinite = true;
        w[t] = Number.NaN;
      }
      if (!Number.isFinite(xc[t])) xc[t] = 0;
    }
    xcols.push(xc);
  }
  if (nonFinite) flags.push('non-finite-input');
  let nobs = 0;
  for (let t = 0; t < n; t++) if (!Number.isNaN(w[t])) nobs++;
  return { n, y: yc, w, xcols, nobs, flags, u };
}

function lastLevels(yFilled: Float64Array, d: number): number[] {
  const out: number[] = [];
  for (let k = 1; k <= d; k++) out.push(yFilled.length - k >= 0 ? yFilled[yFilled.length - k] : 0);
  return out;
}

function xregTail(opts: ArmaFitOptions, n: number): number[][] {
  return (opts.xreg ?? []).map((col) => {
    const tail: number[] = [];
    for (let k = 1; k <= opts.d; k++) tail.push(n - k >= 0 ? col[n - k] : 0);
    return tail;
  });
}

/** White noise around the mean (d = 0) or a random walk from the last value (d ≥ 1). */
function fallbackFit(prep: Prepared, opts: ArmaFitOptions, includeMean: boolean, flags: string[]): ArmaFit {
  const { n, y, w } = prep;
  const { p, d, q } = opts;
  const kind: 'mean' | 'last-value' = d === 0 ? 'mean' : 'last-value';
  // Level: the mean of the observed values, or the last observed value.
  let sum = 0;
  let count = 0;
  let last = Number.NaN;
  for (let t = 0; t < n; t++) {
    if (!Number.isNaN(y[t])) {
      sum += y[t];
      count++;
      last = y[t];
    }
  }
  if (count === 0) {
    flags.push('no-observations');
    sum = 0;
    count = 1;
    last = 0;
  }
  const level = kind === 'mean' ? sum / count : last;
  // Innovation variance: of y around its mean, or of the first differences.
  let ss = 0;
  let m = 0;
  if (kind === 'mean') {
    for (let t = 0; t < n; t++) {
      if (!Number.isNaN(y[t])) {
        ss += (y[t] - level) ** 2;
        m++;
      }
    }
  } else {
    for (let t = 1; t < n; t++) {
      const dv = y[t] - y[t - 1];
      if (!Number.isNaN(dv)) {
        ss += dv * dv;
        m++;
      }
    }
  }
  const sigma2 = m > 0 && Number.isFinite(ss) ? ss / m : 0;
  const nobsFallback = m;
  let loglik = Number.NaN;
  if (sigma2 > 0 && m > 0) loglik = -0.5 * m * (Math.log(2 * Math.PI * sigma2) + 1);
  const nparams = kind === 'mean' ? 2 : 1;
  const aic = -2 * loglik + 2 * nparams;
  const denom = nobsFallback - nparams - 1;
  const [residuals, standardized, fitted] = float64Block([n, n, n]);
  residuals.fill(Number.NaN);
  standardized.fill(Number.NaN);
  fitted.fill(Number.NaN);
  for (let t = 0; t < n; t++) {
    if (kind === 'mean') fitted[t] = level;
    else if (t > 0 && !Number.isNaN(y[t - 1])) fitted[t] = y[t - 1];
    if (!Number.isNaN(w[t]) && !Number.isNaN(fitted[t])) {
      residuals[t] = y[t] - fitted[t];
      standardized[t] = sigma2 > 0 ? residuals[t] / Math.sqrt(sigma2) : 0;
    }
  }
  const r = Math.max(p, q + 1);
  const cov = new Array<number>(r * r).fill(0);
  cov[0] = 1;
  const out: ArmaFit = {
    order: { p, d, q },
    includeMean,
    mean: includeMean ? (kind === 'mean' ? level : 0) : null,
    xregCoef: (opts.xreg ?? []).map(() => 0),
    ar: new Array<number>(p).fill(0),
    ma: new Array<number>(q).fill(0),
    sigma2,
    loglik,
    aic,
    aicc: denom > 0 ? aic + (2 * nparams * (nparams + 1)) / denom : Number.POSITIVE_INFINITY,
    bic: -2 * loglik + Math.log(Math.max(1, nobsFallback)) * nparams,
    nobs: prep.nobs,
    nparams,
    converged: false,
    stderr: {
      ar: new Array<number>(p).fill(Number.NaN),
      ma: new Array<number>(q).fill(Number.NaN),
      mean: includeMean ? (m > 0 ? Math.sqrt(sigma2 / m) : 0) : null,
      xreg: (opts.xreg ?? []).map(() => Number.NaN),
    },
    residuals,
    standardizedResiduals: standardized,
    fitted,
    flags: [...flags, 'fallback'],
    fallback: kind,
    forecastState: {
      state: new Array<number>(r).fill(0),
      covariance: cov,
      lastLevels: new Array<number>(d).fill(last),
      n,
      xregTail: xregTail(opts, n),
      level,
    },
    evaluations: 0,
    gradients: 0,
  };
  return out;
}

export function fitArma(y: ArrayLike<number>, opts: ArmaFitOptions): ArmaFit {
  checkOrder(opts);
  // The fit's temporaries (the likelihood's record, the starts' regressions, the Hessian) come from
  // scratch space and are freed here; what the fit returns is allocated as usual.
  return withScratch(() => fitScratched(y, opts));
}

function fitScratched(y: ArrayLike<number>, opts: ArmaFitOptions): ArmaFit {
  const { p, d, q } = opts;
  const includeMean = opts.includeMean ?? d === 0;
  const prep = prepare(y, opts, includeMean);
  const flags = [...prep.flags];
  const { n, w, xcols, nobs } = prep;
  const k = xcols.length;

  if (nobs <= p + q + 2 || nobs <= k + 1) {
    flags.push('too-short');
    return fallbackFit(prep, opts, includeMean, flags);
  }
  // Constant differenced series: nothing to fit.
  let first = Number.NaN;
  let constant = true;
  let allZero = true;
  for (let t = 0; t < n; t++) {
    const v = w[t];
    if (Number.isNaN(v)) continue;
    if (Number.isNaN(first)) first = v;
    else if (v !== first) constant = false;
    if (!Number.isNaN(prep.y[t]) && prep.y[t] !== 0) allZero = false;
  }
  if (constant) {
    flags.push(allZero ? 'all-zero' : 'constant');
    return fallbackFit(prep, opts, includeMean, flags);
  }

  // Remove a preliminary OLS fit of the regressors and rescale, so that GLS works on deviations of
  // order one (no cancellation in Σv² − β'Xv for levels like 1e7).
  const beta0 = new Float64Array(k);
  if (k > 0) {
    const xtx = new Float64Array(k * k);
    const xty = new Float64Array(k);
    for (let t = 0; t < n; t++) {
      if (Number.isNaN(w[t])) continue;
      for (let i = 0; i < k; i++) {
        xty[i] += xcols[i][t] * w[t];
        for (let j = 0; j < k; j++) xtx[i * k + j] += xcols[i][t] * xcols[j][t];
      }
    }
    const b = solveNormalEquations(xtx, xty, k);
    if (!b) {
      flags.push('collinear-regressors');
      return fallbackFit(prep, opts, includeMean, flags);
    }
    beta0.set(b);
  }
  const u = prep.u;
  let ss = 0;
  for (let t = 0; t < n; t++) {
    if (Number.isNaN(w[t])) {
      u[t] = Number.NaN;
      continue;
    }
    let xb = 0;
    for (let i = 0; i < k; i++) xb += xcols[i][t] * beta0[i];
    u[t] = w[t] - xb;
    ss += u[t] * u[t];
  }
  const scale = Math.sqrt(ss / nobs);
  if (!(scale > 0) || !Number.isFinite(scale)) {
    flags.push('constant');
    return fallbackFit(prep, opts, includeMean, flags);
  }
  for (let t = 0; t < n; t++) u[t] /= scale;

  const search = searchOptimum(
    u,
    xcols,
    p,
    q,
    opts.maxIterations ?? 200,
    new Map(),
    opts.effort ?? 'thorough',
  );
  if (!search) {
    flags.push('not-converged');
    return fallbackFit(prep, opts, includeMean, flags);
  }
  const lik = search.lik;
  const best = search;
  let arHat = search.ar;
  let maHat = search.ma;
  // The reported likelihood, β̂ and the filter's outputs from one exact pass (no steady-state
  // shortcut), taken before the Hessian's passes.
  let exact = lik.exactFit(arHat, maHat);
  // A search that ends on the edge of the region (an AR root on the unit circle, where the mean is
  // no longer identified, or an MA one) can leave the exact pass without a finite likelihood where
  // its own passes had one: move every root outward by the factor 1/(1 − δ), c_i → c_i (1 − δ)^i,
  // for the smallest δ that gives one.
  for (const delta of EDGE_STEPS) {
    if (exact) break;
    arHat = rootsMovedOutward(search.ar, delta);
    maHat = rootsMovedOutward(search.ma, delta);
    exact = lik.exactFit(arHat, maHat);
  }
  if (!exact) {
    flags.push('filter-failed');
    return fallbackFit(prep, opts, includeMean, flags);
  }
  const { value, sigma2: sigma2U, outputs: det } = exact;
  const betaU = exact.beta;
  const loglik = lik.loglikFromObjective(value) - nobs * Math.log(scale);
  const sigma2 = sigma2U * scale * scale;
  const beta = new Float64Array(k);
  for (let i = 0; i < k; i++) beta[i] = beta0[i] + scale * betaU[i];

  // Standard errors from the numerical Hessian of −log L = nobs · objective (σ² concentrated).
  const se = naturalStandardErrors(lik, arHat, maHat, betaU, nobs);
  if (!se.ok) flags.push('hessian-not-definite');

  const [residuals, standardized, fitted, yFilled] = float64Block([n, n, n, n]);
  residuals.fill(Number.NaN);
  standardized.fill(Number.NaN);
  fitted.fill(Number.NaN);
  yFilled.set(prep.y);
  const c = integrationWeights(d);
  let state: number[] = new Array<number>(Math.max(p, q + 1)).fill(0);
  let covariance: number[] = [];
  if (det) {
    for (let t = 0; t < n; t++) {
      let xb0 = 0;
      for (let i = 0; i < k; i++) xb0 += xcols[i][t] * beta0[i];
      const predW = scale * det.predictions[t] + xb0;
      let pred = predW;
      if (t < d) pred = Number.NaN;
      else for (let j = 0; j < d; j++) pred += c[j] * yFilled[t - 1 - j];
      fitted[t] = pred;
      if (Number.isNaN(yFilled[t]) && !Number.isNaN(pred)) yFilled[t] = pred;
      if (!Number.isNaN(det.innovations[t])) {
        residuals[t] = scale * det.innovations[t];
        standardized[t] = det.innovations[t] / Math.sqrt(sigma2U * det.variances[t]);
      }
    }
    state = det.state.map((v) => v * scale);
    covariance = det.covariance;
  } else {
    flags.push('filter-failed');
  }
  if (!best.converged) flags.push('not-converged');

  const nparams = p + q + k + 1;
  const aic = -2 * loglik + 2 * nparams;
  const denom = nobs - nparams - 1;
  const meanIndex = includeMean ? 0 : -1;
  return {
    order: { p, d, q },
    includeMean,
    mean: includeMean ? beta[0] : null,
    xregCoef: numberArray(beta, includeMean ? 1 : 0),
    ar: arHat,
    ma: maHat,
    sigma2,
    loglik,
    aic,
    aicc: denom > 0 ? aic + (2 * nparams * (nparams + 1)) / denom : Number.POSITIVE_INFINITY,
    bic: -2 * loglik + Math.log(nobs) * nparams,
    nobs,
    nparams,
    converged: best.converged,
    stderr: {
      ar: se.values.slice(0, p),
      ma: se.values.slice(p, p + q),
      mean: includeMean ? se.values[p + q + meanIndex] * scale : null,
      xreg: se.values.slice(p + q + (includeMean ? 1 : 0)).map((v) => v * scale),
    },
    residuals,
    standardizedResiduals: standardized,
    fitted,
    flags,
    fallback: null,
    forecastState: {
      state,
      covariance,
      lastLevels: lastLevels(yFilled, d),
      n,
      xregTail: xregTail(opts, n),
      level: Number.NaN,
    },
    evaluations: lik.evaluations,
    gradients: lik.gradients,
  };
}

/**
 * √diag of the inverse of the Hessian of −log L in (φ, θ, β) with σ² concentrated out (the profile
 * likelihood gives the same covariance for the remaining parameters: Patefield 1977, Biometrika
 * 64(3)), as base R's stats::arima computes it. The (φ, θ) block by central differences (step 1e-4,
 * the mixed terms from the ++ and −− points: Abramowitz & Stegun 1964, 25.3.27); the β blocks
 * analytically from the GLS sums of each stencil pass, since −log L is a function of
 * SSR(β) = Σ (v_y − V_X β)²/F: ∂f/∂β = (S_XX β − S_Xy)/SSR, ∂²f/∂β² = S_XX/SSR at β̂.
 */
function naturalStandardErrors(
  lik: ArmaLikelihood,
  ar: number[],
  ma: number[],
  beta: number[],
  nobs: number,
): { values: number[]; ok: boolean } {
  const p = ar.length;
  const q = ma.length;
  const k = beta.length;
  const ma0 = p + q;
  const m = ma0 + k;
  const nan = new Array<number>(m).fill(Number.NaN);
  if (m === 0) return { values: [], ok: true };
  // Typed arrays throughout (one element kind, so the optimised code never meets another).
  const z0 = new Float64Array(ma0);
  z0.set(ar);
  z0.set(ma, p);
  const h = new Float64Array(ma0).fill(1e-4);
  const arW = new Float64Array(p);
  const maW = new Float64Array(q);
  const z = Float64Array.from(z0);
  const g = new Float64Array(k);
  const f = (grad?: Float64Array): number => {
    for (let i = 0; i < p; i++) arW[i] = z[i];
    for (let i = 0; i < q; i++) maW[i] = z[p + i];
    const v = lik.fixed(arW, maW, beta);
    if (grad && Number.isFinite(v)) lik.gradientBeta(beta, grad);
    return v;
  };
  const [H] = scratchBlock([m * m]);
  const f0 = f();
  if (!Number.isFinite(f0)) return { values: nan, ok: false };
  // Every stencil pass switches to the steady state where the base pass did (a smooth function).
  lik.freezeSwitches();
  // β block from the base pass.
  if (k > 0) {
    let ssr = lik.syy;
    for (let i = 0; i < k; i++) {
      let s = -2 * lik.sxy[i];
      for (let j = 0; j < k; j++) s += (i >= j ? lik.sxx[i * k + j] : lik.sxx[j * k + i]) * beta[j];
      ssr += beta[i] * s;
    }
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        H[(ma0 + i) * m + ma0 + j] = (i >= j ? lik.sxx[i * k + j] : lik.sxx[j * k + i]) / ssr;
      }
    }
  }
  const fp = new Float64Array(ma0);
  const fm = new Float64Array(ma0);
  const gp = new Float64Array(k);
  for (let i = 0; i < ma0; i++) {
    // Shrink the step while the model at ±h leaves the admissible region (an optimum on the edge).
    for (let tries = 0; tries < 6; tries++) {
      z[i] = z0[i] + h[i];
      fp[i] = f(gp);
      z[i] = z0[i] - h[i];
      fm[i] = f(g);
      z[i] = z0[i];
      if (Number.isFinite(fp[i]) && Number.isFinite(fm[i])) break;
      h[i] /= 4;
    }
    H[i * m + i] = (fp[i] - 2 * f0 + fm[i]) / (h[i] * h[i]);
    for (let j = 0; j < k; j++) {
      const v = (gp[j] - g[j]) / (2 * h[i]);
      H[i * m + ma0 + j] = v;
      H[(ma0 + j) * m + i] = v;
    }
  }
  for (let i = 0; i < ma0; i++) {
    for (let j = 0; j < i; j++) {
      z[i] = z0[i] + h[i];
      z[j] = z0[j] + h[j];
      const fpp = f();
      z[i] = z0[i] - h[i];
      z[j] = z0[j] - h[j];
      const fmm = f();
      z[i] = z0[i];
      z[j] = z0[j];
      const v = (fpp - fp[i] - fp[j] + 2 * f0 - fm[i] - fm[j] + fmm) / (2 * h[i] * h[j]);
      H[i * m + j] = v;
      H[j * m + i] = v;
    }
  }
  lik.releaseSwitches();
  for (let i = 0; i < m * m; i++) {
    if (!Number.isFinite(H[i])) return { values: nan, ok: false };
    H[i] *= nobs;
  }
  const inv = invertSymmetric(H, m);
  if (!inv) return { values: nan, ok: false };
  const values: number[] = [];
  let ok = true;
  for (let i = 0; i < m; i++) {
    const v = inv[i * m + i];
    if (v > 0) values.push(Math.sqrt(v));
    else {
      values.push(Number.NaN);
      ok = false;
    }
  }
  return { values, ok };
}

/** Inverse of a symmetric matrix by Gauss–Jordan elimination with partial pivoting. */
function invertSymmetric(A: Float64Array, m: number): Float64Array | null {
  const [a, inv] = scratchBlock([m * m, m * m]);
  a.set(A);
  for (let i = 0; i < m; i++) inv[i * m + i] = 1;
  for (let c = 0; c < m; c++) {
    let piv = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(a[r * m + c]) > Math.abs(a[piv * m + c])) piv = r;
    const pv = a[piv * m + c];
    if (!(Math.abs(pv) > 1e-300)) return null;
    if (piv !== c) {
      for (let j = 0; j < m; j++) {
        let t = a[c * m + j];
        a[c * m + j] = a[piv * m + j];
        a[piv * m + j] = t;
        t = inv[c * m + j];
        inv[c * m + j] = inv[piv * m + j];
        inv[piv * m + j] = t;
      }
    }
    for (let j = 0; j < m; j++) {
      a[c * m + j] /= pv;
      inv[c * m + j] /= pv;
    }
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = a[r * m + c];
      if (f === 0) continue;
      for (let j = 0; j < m; j++) {
        a[r * m + j] -= f * a[c * m + j];
        inv[r * m + j] -= f * inv[c * m + j];
      }
    }
  }
  return inv;
}
