/**
 * KPSS test of level stationarity (Kwiatkowski, Phillips, Schmidt & Shin 1992, J. Econometrics 54).
 *   e_t = y_t − ȳ,  S_t = e_1 + … + e_t,  η = (1/n²) Σ S_t² / s²(l),
 *   s²(l) = (1/n) Σ e_t² + (2/n) Σ_{s=1}^{l} (1 − s/(l+1)) Σ_{t=s+1}^{n} e_t e_{t−s}   (Bartlett window).
 * Lag rule: l = ⌊4 (n/100)^{1/4}⌋, the paper's "l4" truncation. Missing values (NaN) are dropped
 * first. Level-stationarity is rejected at 5% when η > 0.463 (their Table 1, η_μ column).
 */
export const KPSS_CRITICAL_LEVEL = { p10: 0.347, p05: 0.463, p025: 0.574, p01: 0.739 } as const;

export interface KpssResult {
  statistic: number;
  lags: number;
  n: number;
  /** η > 0.463: the series is not level-stationary at 5%. */
  rejects: boolean;
}

export function kpssLags(n: number): number {
  return Math.floor(4 * (n / 100) ** 0.25);
}

export function kpss(y: ArrayLike<number>, lags?: number): KpssResult {
  let n = 0;
  let sum = 0;
  for (let i = 0; i < y.length; i++) {
    if (Number.isFinite(y[i])) {
      n++;
      sum += y[i];
    }
  }
  const l = lags ?? kpssLags(n);
  if (n < 3) return { statistic: 0, lags: l, n, rejects: false };
  const mean = sum / n;
  const e = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < y.length; i++) if (Number.isFinite(y[i])) e[k++] = y[i] - mean;
  let s0 = 0;
  let partial = 0;
  let sumS2 = 0;
  for (let t = 0; t < n; t++) {
    s0 += e[t] * e[t];
    partial += e[t];
    sumS2 += partial * partial;
  }
  let longRun = s0 / n;
  for (let s = 1; s <= l && s < n; s++) {
    let c = 0;
    for (let t = s; t < n; t++) c += e[t] * e[t - s];
    longRun += (2 / n) * (1 - s / (l + 1)) * c;
  }
  // A constant series has no variation to test: call it stationary.
  if (!(longRun > 1e-12 * (1 + mean * mean))) return { statistic: 0, lags: l, n, rejects: false };
  const statistic = sumS2 / (n * n) / longRun;
  return { statistic, lags: l, n, rejects: statistic > KPSS_CRITICAL_LEVEL.p05 };
}

/** First difference, NaN where either side is missing. */
export function difference(y: ArrayLike<number>): Float64Array {
  const out = new Float64Array(Math.max(0, y.length - 1));
  for (let i = 1; i < y.length; i++) out[i - 1] = y[i] - y[i - 1];
  return out;
}

/**
 * Order of differencing d ≤ maxD: difference while KPSS rejects level stationarity at 5%
 * (the same repeated use of the test as in Hyndman & Khandakar 2008).
 */
export function chooseDifferencing(y: ArrayLike<number>, maxD = 2): { d: number; tests: KpssResult[] } {
  const tests: KpssResult[] = [];
  let w: ArrayLike<number> = y;
  let d = 0;
  while (d < maxD) {
    const t = kpss(w);
    tests.push(t);
    if (!t.rejects) break;
    w = difference(w);
    d++;
    if (countFinite(w) < 8) break;
  }
  return { d, tests };
}

function countFinite(y: ArrayLike<number>): number {
  let n = 0;
  for (let i = 0; i < y.length; i++) if (Number.isFinite(y[i])) n++;
  return n;
}
