/**
 * Demand classification by average inter-demand interval (ADI) and the squared coefficient of
 * variation of the non-zero demand sizes (CV²), with the cut-offs ADI = 1.32 and CV² = 0.49 of
 * Syntetos, Boylan & Croston (2005), J. Operational Research Society 56:
 *   smooth: ADI < 1.32, CV² < 0.49     erratic: ADI < 1.32, CV² ≥ 0.49
 *   intermittent: ADI ≥ 1.32, CV² < 0.49     lumpy: ADI ≥ 1.32, CV² ≥ 0.49
 * ADI = observed weeks / weeks with demand (the mean interval between demands); CV² uses the
 * population variance of the non-zero sizes (divided by their count). Missing weeks are skipped.
 */
export type DemandClass = 'smooth' | 'erratic' | 'intermittent' | 'lumpy';

export const ADI_CUTOFF = 1.32;
export const CV2_CUTOFF = 0.49;

export interface DemandProfile {
  demandClass: DemandClass;
  adi: number;
  cv2: number;
  observedWeeks: number;
  demandWeeks: number;
}

export function classifyDemand(y: ArrayLike<number>): DemandProfile {
  let observed = 0;
  let count = 0;
  let sum = 0;
  let sum2 = 0;
  for (let i = 0; i < y.length; i++) {
    const v = y[i];
    if (!Number.isFinite(v)) continue;
    observed++;
    if (v !== 0) {
      count++;
      sum += v;
      sum2 += v * v;
    }
  }
  const adi = count > 0 ? observed / count : Number.POSITIVE_INFINITY;
  let cv2 = 0;
  if (count > 0) {
    const mean = sum / count;
    const variance = Math.max(0, sum2 / count - mean * mean);
    cv2 = mean !== 0 ? variance / (mean * mean) : 0;
  }
  const sparse = adi >= ADI_CUTOFF;
  const variable = cv2 >= CV2_CUTOFF;
  const demandClass: DemandClass = sparse
    ? variable
      ? 'lumpy'
      : 'intermittent'
    : variable
      ? 'erratic'
      : 'smooth';
  return {
    demandClass,
    adi: Number.isFinite(adi) ? adi : observed,
    cv2,
    observedWeeks: observed,
    demandWeeks: count,
  };
}
