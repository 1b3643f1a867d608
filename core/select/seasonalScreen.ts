import { solve } from 'ml-matrix';
import { chiSquareUpperTail } from '../diagnose/chiSquare';
import { fourierColumns } from './fourier';

/**
 * A cheap first test of whether annual Fourier terms are worth a full search: a Lagrange-multiplier
 * test on the one-step innovations of the non-seasonal model. Regress the innovations on a constant
 * and K harmonic pairs by ordinary least squares; under "no annual cycle left" n·R² ~ χ²_{2K}
 * (Breusch & Pagan 1980, Rev. Econ. Studies 47, the n·R² form of the LM statistic). Only when it is
 * significant at 5% are the Fourier terms fitted jointly with the ARMA errors and K chosen by AICc.
 */
export interface SeasonalScreenResult {
  tried: boolean;
  statistic: number;
  df: number;
  pValue: number;
}

export const SCREEN_HARMONICS = 3;
export const SCREEN_LEVEL = 0.05;

export function seasonalScreen(
  innovations: ArrayLike<number>,
  times: ArrayLike<number>,
  harmonics = SCREEN_HARMONICS,
): SeasonalScreenResult {
  // Innovations may be shorter than the calendar (differencing drops the first weeks): align ends.
  const offset = times.length - innovations.length;
  const idx: number[] = [];
  for (let i = 0; i < innovations.length; i++) {
    if (Number.isFinite(innovations[i]) && i + offset >= 0) idx.push(i);
  }
  const k = 2 * harmonics + 1;
  const n = idx.length;
  const df = 2 * harmonics;
  if (n < 3 * k) return { tried: true, statistic: 0, df, pValue: 1 };
  const t = new Float64Array(n);
  const e = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    t[j] = times[idx[j] + offset];
    e[j] = innovations[idx[j]];
  }
  const cols = fourierColumns(t, harmonics);
  // Normal equations XᵀX b = Xᵀe with X = [1, sin_1, cos_1, …].
  const xtx: number[][] = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  const xte: number[][] = Array.from({ length: k }, () => [0]);
  const col = (c: number, j: number): number => (c === 0 ? 1 : cols[c - 1][j]);
  let mean = 0;
  for (let j = 0; j < n; j++) mean += e[j];
  mean /= n;
  let tss = 0;
  for (let j = 0; j < n; j++) {
    tss += (e[j] - mean) ** 2;
    for (let a = 0; a < k; a++) {
      const xa = col(a, j);
      xte[a][0] += xa * e[j];
      for (let b = a; b < k; b++) xtx[a][b] += xa * col(b, j);
    }
  }
  for (let a = 0; a < k; a++) for (let b = 0; b < a; b++) xtx[a][b] = xtx[b][a];
  if (!(tss > 0)) return { tried: true, statistic: 0, df, pValue: 1 };
  let beta: number[];
  try {
    beta = solve(xtx, xte).to1DArray();
  } catch {
    return { tried: true, statistic: 0, df, pValue: 1 };
  }
  let rss = 0;
  for (let j = 0; j < n; j++) {
    let fit = 0;
    for (let a = 0; a < k; a++) fit += beta[a] * col(a, j);
    rss += (e[j] - fit) ** 2;
  }
  const r2 = Math.max(0, 1 - rss / tss);
  const statistic = n * r2;
  return { tried: true, statistic, df, pValue: chiSquareUpperTail(statistic, df) };
}
