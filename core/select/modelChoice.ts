import type { ArmaFit } from '../arma/types';
import type { DemandClass, DemandProfile } from '../intermittent/demandClass';
import type { SbaState } from '../intermittent/sba';
import type { ModelOrder } from '../plan/types';
import type { KpssResult } from './kpss';

/**
 * What the automatic model choice returns for one item: plain data only (it crosses worker threads
 * and is stored as JSON). kind 'arma': an ARIMA(p,d,q) with optional Fourier terms (regression with
 * ARMA errors); 'intermittent': a sparse-demand method; 'fallback': no model could be fitted.
 */
export interface Candidate {
  order: ModelOrder;
  seasonalHarmonics: number;
  includeMean: boolean;
  /** null when the fit failed or gave no finite AICc. */
  aicc: number | null;
  /**
   * 'two-stage' when the candidate was only screened (the walk with annual terms): its AICc is from
   * the ARMA part fitted to the series less the neighbouring model's regression, an upper bound on
   * the AICc of its joint fit. Absent for jointly fitted candidates.
   */
  aiccFrom?: 'two-stage';
  /** Why this candidate was not chosen although its AICc was lower or within 0.1 of the winner's. */
  passedOver?: string;
}

export interface Selection {
  search: 'stepwise' | 'grid' | 'forced' | 'none';
  candidates: Candidate[];
  reason: string;
}

export interface ModelChoice {
  kind: 'arma' | 'intermittent' | 'fallback';
  order: ModelOrder;
  seasonalHarmonics: number;
  includeMean: boolean;
  fit: ArmaFit | null;
  intermittent: SbaState | null;
  /** Level and spread used when kind is 'fallback' and no ArmaFit is available. */
  fallbackLevel: { value: number; sd: number; basis: 'mean' | 'last-value' } | null;
  selection: Selection;
  demandClass: DemandClass;
  demand: DemandProfile;
  differencing: KpssResult[];
  /** One-step predictions on the original scale (NaN where undefined). */
  fitted: number[];
  /** One-step errors y − fitted on the original scale (NaN where undefined). */
  residuals: number[];
  /** Date of the last history week; future Fourier terms continue from it. */
  lastWeekStart: string;
  historyWeeks: number;
  observedWeeks: number;
  /** Whether the seasonal pre-test ran and what it found. */
  seasonalScreen: { tried: boolean; statistic: number; df: number; pValue: number } | null;
}
