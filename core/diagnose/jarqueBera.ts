/**
 * Jarque–Bera normality test (Jarque, C. M. & Bera, A. K. 1980, Economics Letters 6; 1987 Int. Stat.
 * Review 55): JB = n/6 · (S² + (K − 3)²/4), S and K the sample skewness and kurtosis with moments
 * about the mean divided by n; under normality JB ~ χ²_2, so p = exp(−JB/2). NaN values are dropped.
 */
export interface JarqueBeraResult {
  statistic: number;
  skewness: number;
  kurtosis: number;
  pValue: number;
  n: number;
}

export function jarqueBera(x: ArrayLike<number>): JarqueBeraResult {
  let n = 0;
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    if (Number.isFinite(x[i])) {
      n++;
      sum += x[i];
    }
  }
  if (n < 3) return { statistic: 0, skewness: 0, kurtosis: 3, pValue: 1, n };
  const mean = sum / n;
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) continue;
    const e = x[i] - mean;
    const e2 = e * e;
    m2 += e2;
    m3 += e2 * e;
    m4 += e2 * e2;
  }
  m2 /= n;
  m3 /= n;
  m4 /= n;
  if (!(m2 > 0)) return { statistic: 0, skewness: 0, kurtosis: 3, pValue: 1, n };
  const skewness = m3 / m2 ** 1.5;
  const kurtosis = m4 / (m2 * m2);
  const statistic = (n / 6) * (skewness * skewness + (kurtosis - 3) ** 2 / 4);
  return { statistic, skewness, kurtosis, pValue: Math.exp(-statistic / 2), n };
}
