/**
 * The latest planning run's results as the screens need them, read through app/store/runs. The
 * per-item extras the run keeps as JSON (fitted values, residual ACF, roots, diagnostics, what the
 * run did with the planner's decisions) are read defensively: a field the run did not write shows
 * as empty rather than breaking the screen.
 */

import { polynomialRoots } from '../../core/arma/roots';
import type { Flag } from '../../core/plan/types';
import { orderCsv } from '../run/orderCsv';
import {
  getChosenModels,
  getItemRunResult,
  getLatestRun,
  getOrderLinesBySupplier,
  getReviewQueue,
  type StoredOrderLine,
} from '../store/runs';
import type { Store } from '../store/store';
import type { CandidateModel, Complex, DiagnosticLine, ItemResult, OrderLine, ReviewEntry } from './contract';

export interface ItemSummary {
  model: string | null;
  flags: Flag[];
  orderQty: number | null;
}

export interface ResultsSource {
  latestRun(): { id: number; finishedAt: string | null; items: number } | null;
  /** SKU → what the overview shows of the latest run. */
  summaries(): Map<string, ItemSummary>;
  item(sku: string, historyWeeks: string[]): ItemResult | null;
  /** Flagged items of the latest run, worst first (app/store/runs getReviewQueue). */
  reviewQueue(): ReviewEntry[];
  orderLines(): OrderLine[];
  /** The order list of the latest run as the command line's `plan` exports it, planner edits applied. */
  ordersCsv(): string;
}

const OVERRIDE_WORDS: Record<string, string> = {
  'forced-model': 'the model chosen by the planner was fitted instead of the automatic choice',
  'forecast-adjustment': "the planner's forecast adjustment was applied to the forecast and the order",
  'safety-stock': 'the safety stock fixed by the planner was used',
};

/** The run records which planner decisions it respected as codes; the screens show them in words. */
export function overrideInWords(code: string): string {
  return OVERRIDE_WORDS[code] ?? code;
}

export function modelLabel(m: {
  p: number;
  d: number;
  q: number;
  seasonalHarmonics: number;
  includeMean?: boolean;
}): string {
  const base = m.d === 0 ? `ARMA(${m.p},${m.q})` : `ARIMA(${m.p},${m.d},${m.q})`;
  return m.seasonalHarmonics > 0 ? `${base}+${m.seasonalHarmonics}h` : base;
}

function nums(v: unknown): number[] {
  return Array.isArray(v) ? v.map((x) => (typeof x === 'number' && Number.isFinite(x) ? x : Number.NaN)) : [];
}

function numsOrNull(v: unknown): (number | null)[] {
  return Array.isArray(v) ? v.map((x) => (typeof x === 'number' && Number.isFinite(x) ? x : null)) : [];
}

function roots(v: unknown): Complex[] {
  if (!Array.isArray(v)) return [];
  return v
    .map((z) => {
      if (Array.isArray(z)) return { re: Number(z[0]), im: Number(z[1] ?? 0) };
      const o = z as { re?: unknown; im?: unknown };
      return { re: Number(o?.re), im: Number(o?.im ?? 0) };
    })
    .filter((z) => Number.isFinite(z.re) && Number.isFinite(z.im));
}

function diagnosticLines(v: unknown): DiagnosticLine[] {
  if (!Array.isArray(v)) return [];
  return v.map((d) => {
    const o = (d ?? {}) as Record<string, unknown>;
    return {
      name: String(o.name ?? o.test ?? 'check'),
      value: typeof o.value === 'number' ? o.value : typeof o.statistic === 'number' ? o.statistic : null,
      pValue: typeof o.pValue === 'number' ? o.pValue : null,
      flagCode: typeof o.flagCode === 'string' ? o.flagCode : typeof o.flag === 'string' ? o.flag : null,
      text: String(o.text ?? o.verdict ?? ''),
    };
  });
}

/** Fitted values aligned with the history's weeks: the run stores them with their own weeks or from the start. */
function alignFitted(extra: Record<string, unknown>, historyWeeks: string[]): (number | null)[] {
  const fitted = numsOrNull(extra.fitted);
  const weeks = Array.isArray(extra.fittedWeeks) ? (extra.fittedWeeks as string[]) : null;
  if (historyWeeks.length === 0) return fitted;
  const out = new Array<number | null>(historyWeeks.length).fill(null);
  if (weeks && weeks.length === fitted.length) {
    const at = new Map(historyWeeks.map((w, i) => [w, i]));
    weeks.forEach((w, k) => {
      const i = at.get(w);
      if (i !== undefined) out[i] = fitted[k];
    });
    return out;
  }
  // Without weeks, the fitted values end with the history's last week.
  const offset = historyWeeks.length - fitted.length;
  for (let k = 0; k < fitted.length; k++) if (k + offset >= 0) out[k + offset] = fitted[k];
  return out;
}

function toOrderLine(l: StoredOrderLine): OrderLine {
  return {
    sku: l.sku,
    description: l.description,
    supplier: l.supplier,
    orderQty: l.orderQty,
    suggestedQty: l.suggestedQty,
    casePacks: l.casePacks,
    reorderPoint: l.reorderPoint,
    orderUpTo: l.orderUpTo,
    safetyStock: l.safetyStock,
    intervalForecast: l.intervalForecast,
    intervalSd: l.intervalSd,
    serviceLevel: l.serviceLevel,
    serviceKind: l.serviceKind,
    flags: l.flags,
    explanation: l.explanation
      .split(/(?<=\.)\s+|\n/)
      .map((s) => s.trim())
      .filter((s) => s !== ''),
    edit: l.edit ? { qty: l.edit.qty, reason: l.edit.reason, at: l.edit.at } : null,
  };
}

export function storeResults(store: Store): ResultsSource {
  const run = getLatestRun(store);
  let summaryCache: Map<string, ItemSummary> | null = null;
  return {
    latestRun: () => (run ? { id: run.id, finishedAt: run.finishedAt, items: run.itemsTotal } : null),

    summaries() {
      if (summaryCache) return summaryCache;
      const out = new Map<string, ItemSummary>();
      if (!run) return (summaryCache = out);
      const flagged = new Map(getReviewQueue(store, run.id).map((e) => [e.sku, e.flags]));
      const orders = getOrderLinesBySupplier(store, { runId: run.id });
      for (const g of orders.groups) {
        for (const l of g.lines) {
          out.set(l.sku, {
            model: null,
            flags: flagged.get(l.sku) ?? [],
            orderQty: l.planned ? l.orderQty : null,
          });
        }
      }
      // The chosen model's label per item, in one read.
      for (const [sku, m] of getChosenModels(store, run.id)) {
        const entry = out.get(sku);
        if (!entry) continue;
        entry.model = m ? modelLabel(m) : null;
        if (m && m.status === 'failed') entry.model = 'failed';
      }
      return (summaryCache = out);
    },

    item(sku, historyWeeks) {
      if (!run) return null;
      const r = getItemRunResult(store, sku, run.id);
      if (!r) return null;
      const extra = (r.diagnostics ?? {}) as Record<string, unknown>;
      const acf = nums(extra.residualAcf).filter((x) => Number.isFinite(x));
      const n = typeof extra.residualCount === 'number' ? extra.residualCount : 0;
      const candidates: CandidateModel[] = r.candidates.map((c) => ({
        label: modelLabel(c),
        order: { p: c.p, d: c.d, q: c.q },
        seasonalHarmonics: c.seasonalHarmonics,
        includeMean: c.includeMean,
        aicc: c.aicc,
        chosen: c.chosen,
      }));
      const m = r.model;
      return {
        runId: r.runId,
        model: m
          ? {
              label: modelLabel(m),
              order: { p: m.p, d: m.d, q: m.q },
              seasonalHarmonics: m.seasonalHarmonics,
              includeMean: m.includeMean,
            }
          : {
              label: r.status === 'failed' ? 'no model (fallback)' : 'none',
              order: { p: 0, d: 0, q: 0 },
              seasonalHarmonics: 0,
              includeMean: true,
            },
        fitted: alignFitted(extra, historyWeeks),
        forecast: r.forecast,
        residualAcf: acf,
        residualCount: n,
        // ±1.96/√n: approximate 95% limits of a white-noise sample ACF (Box & Jenkins 1970, §6.2);
        // the run stores the band it used.
        acfBand: typeof extra.acfBand === 'number' ? extra.acfBand : n > 0 ? 1.96 / Math.sqrt(n) : 0,
        arRoots: Array.isArray(extra.arRoots) ? roots(extra.arRoots) : polynomialRoots(nums(extra.ar)),
        maRoots: Array.isArray(extra.maRoots) ? roots(extra.maRoots) : polynomialRoots(nums(extra.ma)),
        candidates,
        flags: r.flags,
        diagnostics: diagnosticLines(extra.diagnostics),
        order: r.order ? toOrderLine(r.order) : null,
        overridesApplied: Array.isArray(extra.overridesApplied)
          ? extra.overridesApplied.map((c) => overrideInWords(String(c)))
          : [],
      };
    },

    reviewQueue() {
      return run ? getReviewQueue(store, run.id) : [];
    },

    ordersCsv() {
      return orderCsv(getOrderLinesBySupplier(store, { runId: run?.id }).groups);
    },

    orderLines() {
      if (!run) return [];
      return getOrderLinesBySupplier(store, { runId: run.id }).groups.flatMap((g) =>
        g.lines.filter((l) => l.planned).map(toOrderLine),
      );
    },
  };
}
