import cdf from '@stdlib/stats-base-dists-normal-cdf';

/**
 * Level-shift check on the most recent weeks (our stated test). Under a correct model the one-step
 * standardised innovations z_t are independent N(0, 1), so over the last m observed weeks
 *   Z = (z_{n−m+1} + … + z_n) / √m ~ N(0, 1).
 * A shift is reported when |Z| > 3 (two-sided p < 0.0027). The size shown to a planner is the
 * relative gap between actual demand and the model's one-step fit over the same weeks:
 *   gap = (Σ y_t − Σ ŷ_t) / Σ ŷ_t.
 */
export interface LevelShiftResult {
  weeks: number;
  z: number;
  pValue: number;
  relativeGap: number;
  detected: boolean;
}

export const LEVEL_SHIFT_Z = 3;

export function levelShift(
  y: ArrayLike<number>,
  fitted: ArrayLike<number>,
  standardized: ArrayLike<number>,
  weeks = 12,
): LevelShiftResult {
  let m = 0;
  let zSum = 0;
  let ySum = 0;
  let fSum = 0;
  const offset = y.length - standardized.length;
  for (let i = y.length - 1; i >= 0 && m < weeks; i--) {
    const z = standardized[i - offset];
    if (!Number.isFinite(y[i]) || !Number.isFinite(fitted[i]) || !Number.isFinite(z)) continue;
    m++;
    zSum += z;
    ySum += y[i];
    fSum += fitted[i];
  }
  if (m < 4) return { weeks: m, z: 0, pValue: 1, relativeGap: 0, detected: false };
  const z = zSum / Math.sqrt(m);
  const relativeGap = Math.abs(fSum) > 1e-12 ? (ySum - fSum) / Math.abs(fSum) : 0;
  const pValue = 2 * (1 - cdf(Math.abs(z), 0, 1));
  return { weeks: m, z, pValue, relativeGap, detected: Math.abs(z) > LEVEL_SHIFT_Z };
}
