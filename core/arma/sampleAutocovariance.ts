/**
 * Sample autocovariances c_k = (1/n) Σ_{t=k+1..n} (x_t − x̄)(x_{t−k} − x̄), k = 0..maxLag, the
 * usual biased estimator (Box & Jenkins 1976, §2.1.4), over observed points only (NaN = missing;
 * pairs with a missing member are skipped, n counts the observed points), written into out when given
 * (at least maxLag + 1 long, zero-filled).
 */
export function sampleAutocovariance(
  x: ArrayLike<number>,
  maxLag: number,
  demean = true,
  out: Float64Array = new Float64Array(maxLag + 1),
): Float64Array {
  const n = x.length;
  let sum = 0;
  let count = 0;
  for (let t = 0; t < n; t++) {
    const v = x[t];
    if (!Number.isNaN(v)) {
      sum += v;
      count++;
    }
  }
  const mean = demean && count > 0 ? sum / count : 0;
  if (count === 0) return out;
  if (count === n) {
    // No missing point: the same sums without the tests.
    for (let k = 0; k <= maxLag; k++) {
      let s = 0;
      for (let t = k; t < n; t++) s += (x[t] - mean) * (x[t - k] - mean);
      out[k] = s / count;
    }
    return out;
  }
  for (let k = 0; k <= maxLag; k++) {
    let s = 0;
    for (let t = k; t < n; t++) {
      const a = x[t];
      const b = x[t - k];
      if (!Number.isNaN(a) && !Number.isNaN(b)) s += (a - mean) * (b - mean);
    }
    out[k] = s / count;
  }
  return out;
}
