/**
 * Quasi-Newton minimisation by BFGS (Broyden 1970, Fletcher 1970, Goldfarb 1970, Shanno 1970),
 * inverse-Hessian form with the initial scaling sᵀy / yᵀy and a backtracking Armijo line search
 * (Nocedal & Wright 2006, "Numerical Optimization", Alg. 6.1 and §6.1), or a given start for the
 * inverse Hessian. Gradients by central differences unless given. Small and allocation-light: it
 * runs once per start per series.
 */

export interface BfgsOptions {
  maxIterations: number;
  /** Converged when max |g_i| falls below this. */
  gradientTolerance: number;
  /** Or when an iteration lowers f by less than this (absolute), twice in a row. */
  valueTolerance: number;
  /** Finite-difference step. */
  step: number;
  /** Forward differences (m evaluations per gradient) instead of central (2m). */
  forward: boolean;
  /** Called after each iteration; returning true stops the search (e.g. a known optimum is near). */
  abandon?: (x: Float64Array, value: number) => boolean;
  /** Replaces the built-in finite differences: writes ∇f(x) into out, given f(x) = fx. */
  gradient?: (x: Float64Array, fx: number, out: Float64Array) => void;
  /** Replaces the max |g_i| < gradientTolerance test. */
  isConverged?: (x: Float64Array, g: Float64Array) => boolean;
  /** Largest change of any coordinate in one line search step. */
  maxStep: number;
  /**
   * Writes a start for the inverse Hessian (m × m, row-major) at x0 and returns true, or returns
   * false for the default (the identity, rescaled by sᵀy / yᵀy after the first step).
   */
  initialInverseHessian?: (x0: Float64Array, out: Float64Array) => boolean;
}

export interface BfgsResult {
  x: Float64Array;
  value: number;
  iterations: number;
  evaluations: number;
  converged: boolean;
}

export const DEFAULT_BFGS: BfgsOptions = {
  maxIterations: 100,
  gradientTolerance: 1e-6,
  valueTolerance: 1e-11,
  step: 1e-5,
  maxStep: 2,
  forward: false,
};

export function bfgsMinimize(
  f: (x: Float64Array) => number,
  x0: ArrayLike<number>,
  options: Partial<BfgsOptions> = {},
): BfgsResult {
  // Each option with its default (no object spread: this runs for every start of every fit).
  const o: BfgsOptions = {
    maxIterations: options.maxIterations ?? DEFAULT_BFGS.maxIterations,
    gradientTolerance: options.gradientTolerance ?? DEFAULT_BFGS.gradientTolerance,
    valueTolerance: options.valueTolerance ?? DEFAULT_BFGS.valueTolerance,
    step: options.step ?? DEFAULT_BFGS.step,
    forward: options.forward ?? DEFAULT_BFGS.forward,
    maxStep: options.maxStep ?? DEFAULT_BFGS.maxStep,
    abandon: options.abandon,
    gradient: options.gradient,
    isConverged: options.isConverged,
    initialInverseHessian: options.initialInverseHessian,
  };
  const m = x0.length;
  const x = Float64Array.from(x0);
  let evaluations = 0;
  const evalf = (z: Float64Array): number => {
    evaluations++;
    const v = f(z);
    return Number.isFinite(v) ? v : Number.POSITIVE_INFINITY;
  };
  let fx = evalf(x);
  if (m === 0 || !Number.isFinite(fx)) {
    return { x, value: fx, iterations: 0, evaluations, converged: m === 0 && Number.isFinite(fx) };
  }
  const g = new Float64Array(m);
  const gNew = new Float64Array(m);
  const H = new Float64Array(m * m);
  const d = new Float64Array(m);
  const xNew = new Float64Array(m);
  const s = new Float64Array(m);
  const y = new Float64Array(m);
  const Hy = new Float64Array(m);
  const work = new Float64Array(m);

  const gradient = (z: Float64Array, out: Float64Array): void => {
    if (o.gradient) {
      o.gradient(z, fx, out);
      return;
    }
    for (let i = 0; i < m; i++) work[i] = z[i];
    if (o.forward) {
      for (let i = 0; i < m; i++) {
        const h = o.step;
        work[i] = z[i] + h;
        const fp = evalf(work);
        if (Number.isFinite(fp)) out[i] = (fp - fx) / h;
        else {
          work[i] = z[i] - h;
          const fm = evalf(work);
          out[i] = Number.isFinite(fm) ? (fx - fm) / h : 0;
        }
        work[i] = z[i];
      }
      return;
    }
    for (let i = 0; i < m; i++) {
      const h = o.step;
      work[i] = z[i] + h;
      const fp = evalf(work);
      work[i] = z[i] - h;
      const fm = evalf(work);
      work[i] = z[i];
      if (Number.isFinite(fp) && Number.isFinite(fm)) out[i] = (fp - fm) / (2 * h);
      else if (Number.isFinite(fp)) out[i] = (fp - fx) / h;
      else if (Number.isFinite(fm)) out[i] = (fx - fm) / h;
      else out[i] = 0;
    }
  };
  const resetH = (scale: number): void => {
    H.fill(0);
    for (let i = 0; i < m; i++) H[i * m + i] = scale;
  };

  gradient(x, g);
  // `first`: the curvature model is still the scaled identity, to be rescaled after one step.
  let first = true;
  if (o.initialInverseHessian?.(x, H)) first = false;
  else resetH(1);
  let converged = false;
  let smallSteps = 0;
  let iterations = 0;
  for (; iterations < o.maxIterations; iterations++) {
    let gmax = 0;
    for (let i = 0; i < m; i++) gmax = Math.max(gmax, Math.abs(g[i]));
    if (o.isConverged ? o.isConverged(x, g) : gmax < o.gradientTolerance) {
      converged = true;
      break;
    }
    let slope = 0;
    for (let i = 0; i < m; i++) {
      let v = 0;
      for (let j = 0; j < m; j++) v -= H[i * m + j] * g[j];
      d[i] = v;
      slope += v * g[i];
    }
    if (!(slope < 0)) {
      // Not a descent direction: restart from steepest descent.
      resetH(1);
      for (let i = 0; i < m; i++) d[i] = -g[i];
      slope = 0;
      for (let i = 0; i < m; i++) slope -= g[i] * g[i];
    }
    let dmax = 0;
    for (let i = 0; i < m; i++) dmax = Math.max(dmax, Math.abs(d[i]));
    let alpha = dmax > o.maxStep ? o.maxStep / dmax : 1;
    let fNew = Number.POSITIVE_INFINITY;
    let accepted = false;
    for (let ls = 0; ls < 30; ls++) {
      for (let i = 0; i < m; i++) xNew[i] = x[i] + alpha * d[i];
      fNew = evalf(xNew);
      if (fNew <= fx + 1e-4 * alpha * slope) {
        accepted = true;
        break;
      }
      alpha *= fNew === Number.POSITIVE_INFINITY ? 0.1 : 0.5;
    }
    if (!accepted) {
      if (first) break;
      // Start the curvature model afresh once; give up if that does not help either.
      resetH(1);
      first = true;
      continue;
    }
    const decrease = fx - fNew;
    for (let i = 0; i < m; i++) {
      s[i] = xNew[i] - x[i];
      x[i] = xNew[i];
    }
    fx = fNew;
    gradient(x, gNew);
    let sy = 0;
    let yy = 0;
    for (let i = 0; i < m; i++) {
      y[i] = gNew[i] - g[i];
      g[i] = gNew[i];
      sy += s[i] * y[i];
      yy += y[i] * y[i];
    }
    if (sy > 1e-18) {
      if (first) resetH(sy / yy);
      first = false;
      // H ← (I − ρ s yᵀ) H (I − ρ y sᵀ) + ρ s sᵀ
      const rho = 1 / sy;
      let yHy = 0;
      for (let i = 0; i < m; i++) {
        let v = 0;
        for (let j = 0; j < m; j++) v += H[i * m + j] * y[j];
        Hy[i] = v;
        yHy += v * y[i];
      }
      const c = (1 + rho * yHy) * rho;
      for (let i = 0; i < m; i++) {
        for (let j = 0; j < m; j++) {
          H[i * m + j] += c * s[i] * s[j] - rho * (Hy[i] * s[j] + s[i] * Hy[j]);
        }
      }
    }
    if (o.abandon?.(x, fx)) break;
    if (decrease < o.valueTolerance) {
      if (++smallSteps >= 2) {
        converged = true;
        iterations++;
        break;
      }
    } else smallSteps = 0;
  }
  return { x, value: fx, iterations, evaluations, converged };
}
