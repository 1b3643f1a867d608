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
    // No missing point: the same sums without the tests, in four interleaved partial sums (four
    // independent additions in flight instead of one chain).
    for (let k = 0; k <= maxLag; k++) {
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      let t = k;
      for (; t + 3 < n; t += 4) {
        s0 += (x[t] - mean) * (x[t - k] - mean);
        s1 += (x[t + 1] - mean) * (x[t + 1 - k] - mean);
        s2 += (x[t + 2] - mean) * (x[t + 2 - k] - mean);
        s3 += (x[t + 3] - mean) * (x[t + 3 - k] - mean);
      }
      for (; t < n; t++) s0 += (x[t] - mean) * (x[t - k] - mean);
      out[k] = (s0 + s1 + (s2 + s3)) / count;
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
