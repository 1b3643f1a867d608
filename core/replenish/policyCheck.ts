import type { ItemSettings, ModelSummary, ServiceKind } from '../plan/types';
import { type PolicySimulationResult, simulatePolicy } from './policySimulation';

/**
 * The policy check for one planned item: simulate years of demand from the item's own fitted model
 * and run its policy (lead time, review period, case pack, MOQ, service target) week by week
 * (core/replenish/policySimulation). Only a stationary ARMA model (d = 0, no annual terms) has a
 * long run to simulate; for any other model the check says why it was not run. Lead time and
 * review period are rounded to whole weeks, the simulation's time step.
 */
export interface PolicyCheck {
  result: PolicySimulationResult | null;
  /** What was simulated, or why nothing was. */
  note: string;
}

export function checkPolicy(
  model: ModelSummary,
  settings: Pick<ItemSettings, 'leadTimeWeeks' | 'reviewPeriodWeeks' | 'casePack' | 'moq'>,
  service: { kind: ServiceKind; level: number },
  options: { years?: number; seed?: number; lotSize?: number | null } = {},
): PolicyCheck {
  if (model.kind !== 'arma')
    return { result: null, note: `not simulated: the item has a ${model.kind} model, not ARMA` };
  if (model.order.d > 0 || model.seasonalHarmonics > 0) {
    return {
      result: null,
      note: 'not simulated: a differenced or seasonal model has no stationary long run to simulate',
    };
  }
  const sigma2 = model.sigma2 ?? Number.NaN;
  const mean = model.mean ?? Number.NaN;
  if (!(sigma2 > 0) || !Number.isFinite(mean)) {
    return { result: null, note: 'not simulated: the model has no usable mean or innovation variance' };
  }
  const L = Math.max(0, Math.round(settings.leadTimeWeeks));
  const R = Math.max(0, Math.round(settings.reviewPeriodWeeks));
  const years = options.years ?? 100;
  const result = simulatePolicy({
    model: { ar: model.ar, ma: model.ma, sigma2, mean },
    leadTimeWeeks: L,
    reviewPeriodWeeks: R,
    service,
    years,
    seed: options.seed ?? 1,
    casePack: Math.max(1, settings.casePack || 1),
    moq: Math.max(0, settings.moq || 0),
    lotSize: options.lotSize ?? undefined,
  });
  return {
    result,
    note: `${years} years simulated from ${model.label}, lead time ${L} and review period ${R} weeks`,
  };
}
