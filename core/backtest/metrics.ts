/**
 * Forecast accuracy measures.
 * MASE (Hyndman & Koehler 2006, Int. J. Forecasting 22): mean |e| divided by the in-sample mean
 * absolute error of the (seasonal) naive forecast, (1/(n−m)) Σ_{t>m} |y_t − y_{t−m}|, m = 1 for naive
 * and 52 for seasonal naive on weekly data. Bias: mean error (actual − forecast). Coverage: share of
 * actuals inside the interval.
 */
export function naiveScale(y: ArrayLike<number>, m = 1): number {
  let s = 0;
  let k = 0;
  for (let t = m; t < y.length; t++) {
    const e = y[t] - y[t - m];
    if (!Number.isFinite(e)) continue;
    s += Math.abs(e);
    k++;
  }
  return k > 0 ? s / k : Number.NaN;
}

export function meanAbsolute(errors: ArrayLike<number>): number {
  let s = 0;
  let k = 0;
  for (let i = 0; i < errors.length; i++) {
    if (!Number.isFinite(errors[i])) continue;
    s += Math.abs(errors[i]);
    k++;
  }
  return k > 0 ? s / k : Number.NaN;
}

export function meanOf(x: ArrayLike<number>): number {
  let s = 0;
  let k = 0;
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) continue;
    s += x[i];
    k++;
  }
  return k > 0 ? s / k : Number.NaN;
}

/** MASE of errors against a scale; a zero scale (constant history) gives 0 for zero errors, else Infinity. */
export function mase(errors: ArrayLike<number>, scale: number): number {
  const mae = meanAbsolute(errors);
  if (!Number.isFinite(mae)) return Number.NaN;
  if (scale > 0) return mae / scale;
  return mae === 0 ? 0 : Number.POSITIVE_INFINITY;
}
