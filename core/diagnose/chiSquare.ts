import gammainc from '@stdlib/math-base-special-gammainc';
import normalCdf from '@stdlib/stats-base-dists-normal-cdf';

/**
 * Upper tail of the chi-square distribution, P(X > x) for X ~ χ²_k: the regularised upper
 * incomplete gamma function Q(k/2, x/2) (definition; Abramowitz & Stegun 26.4.19), computed directly
 * rather than as 1 − cdf so that far-tail p-values do not underflow to 0.
 *
 * Every caller's k is a whole number (Ljung–Box lags less the ARMA order; weeks in a window;
 * seasonal terms), and there Q has a closed form (Abramowitz & Stegun 26.4.4 and 26.4.5, quoted
 * from memory; checked against the library to 1e-11 in test/unit/diagnose/residualTests.test.ts):
 *   k even: Q = e^{−x/2} Σ_{j=0}^{k/2−1} (x/2)^j / j!
 *   k odd:  Q = 2Φ(−√x) + 2φ(√x) Σ_{j=1}^{(k−1)/2} x^{j−1/2} / (1·3·…·(2j−1))
 * Its sum of at most k/2 terms is done in logarithms, so a tail that is a double (≥ 1e-308) does
 * not underflow. A fraction of the time of the library's general incomplete gamma, whose many
 * functions, run a couple of times per item, were a tenth of a 1,000-file `fit` call while the
 * JIT warmed them up. Other k go to the library.
 */
export function chiSquareUpperTail(x: number, k: number): number {
  if (!(k > 0)) return Number.NaN;
  if (!(x > 0)) return 1;
  if (x === Number.POSITIVE_INFINITY) return 0;
  if (!Number.isInteger(k) || k > 1000) return gammainc(x / 2, k / 2, true, true);
  const h = x / 2;
  // k even: t_0 = 1, t_j = t_{j−1} · h / j.
  if (k % 2 === 0) return Math.exp(-h + logSeries(0, k / 2, (j) => h / j));
  const r = Math.sqrt(x);
  const normalTail = 2 * normalCdf(-r, 0, 1);
  if (k === 1) return normalTail;
  // k odd: t_1 = √x, t_{j+1} = t_j · x / (2j + 1); 2φ(√x) = √(2/π) e^{−x/2}.
  const logSum = logSeries(Math.log(r), (k - 1) / 2, (j) => x / (2 * j + 1));
  return normalTail + Math.exp(-h + 0.5 * Math.log(2 / Math.PI) + logSum);
}

/**
 * log(t_0 + … + t_{count−1}) for t_0 = e^{logFirst} and t_j = t_{j−1} · ratio(j), kept as
 * e^{max} · s so that neither the terms nor the sum overflow.
 */
function logSeries(logFirst: number, count: number, ratio: (j: number) => number): number {
  let logTerm = logFirst;
  let logMax = logFirst;
  let s = 1;
  for (let j = 1; j < count; j++) {
    logTerm += Math.log(ratio(j));
    if (logTerm > logMax) {
      s = s * Math.exp(logMax - logTerm) + 1;
      logMax = logTerm;
    } else s += Math.exp(logTerm - logMax);
  }
  return logMax + Math.log(s);
}
