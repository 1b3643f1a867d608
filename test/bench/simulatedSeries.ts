/**
 * The fit bench's simulated weekly series (also used by tests that need one of them): for series i
 * of a seed, a random stationary, invertible ARMA(p,q) (partial autocorrelations uniform on
 * (−0.8, 0.8)), σ² = 100, mean 200, 156 weeks, each value rounded to two decimals as the bench's
 * CSV files hold it.
 */
import { createRng, simulateArma } from '../../core/arma';
import { unconstrainedToCoefficients } from '../../core/arma/partialAutocorrelations';

export const BENCH_WEEKS = 156;

function randomModel(
  p: number,
  q: number,
  rng: ReturnType<typeof createRng>,
): { ar: number[]; ma: number[] } {
  const draw = (k: number): number[] => {
    const u = Array.from({ length: k }, () => Math.atanh(1.6 * (rng.uniform() - 0.5)));
    const out = new Float64Array(k);
    unconstrainedToCoefficients(u, 0, k, out, 0, new Float64Array(Math.max(k, 1)));
    return Array.from(out);
  };
  return { ar: draw(p), ma: draw(q) };
}

/** The first `count` series of a seed, as the bench writes them. */
export function simulatedSeries(p: number, q: number, seed: number, count: number): Float64Array[] {
  const rng = createRng(seed);
  const series: Float64Array[] = [];
  for (let i = 0; i < count; i++) {
    const model = randomModel(p, q, rng);
    const y = simulateArma({ ...model, sigma2: 100, mean: 200 }, BENCH_WEEKS, rng);
    series.push(Float64Array.from(y, (v) => Number(v.toFixed(2))));
  }
  return series;
}
