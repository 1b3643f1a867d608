/**
 * The run's own stand-in result for an item whose planning failed outright (the engine threw, its
 * worker died or hung): no model, no forecast, an order line of zero and a critical flag saying so.
 * A zero is deliberate: without a forecast any other number would be a guess, and an order the
 * planner did not ask for is worse than a line that asks for review.
 */
import type { FlagCode } from '../../core/diagnose/flags';
import type { ItemSettings, ServiceKind } from '../../core/plan/types';
import type { ItemRunRecord } from '../store/runs';

export const PLAN_FAILED: FlagCode = 'plan-failed';

export function failedItemRecord(
  settings: Pick<ItemSettings, 'sku' | 'serviceLevel' | 'serviceKind'>,
  kind: 'threw' | 'worker-died' | 'timeout',
  error: string,
  fallbackServiceLevel: number,
): ItemRunRecord {
  const what =
    kind === 'timeout'
      ? 'took too long and was stopped'
      : kind === 'worker-died'
        ? 'stopped the planning worker'
        : 'failed with an error';
  const firstLine = error.split('\n')[0].slice(0, 300);
  const serviceKind: ServiceKind = settings.serviceKind;
  return {
    status: 'failed',
    models: [],
    forecasts: [],
    flags: [
      {
        code: PLAN_FAILED,
        severity: 'critical',
        reason: `Planning this item ${what} (${firstLine}), so it has no forecast and no order suggestion.`,
        action:
          'Check the item’s history and settings, then run the planning again; order by hand meanwhile.',
      },
    ],
    order: {
      orderQty: 0,
      casePacks: 0,
      reorderPoint: 0,
      orderUpTo: 0,
      safetyStock: 0,
      intervalForecast: 0,
      intervalSd: 0,
      serviceLevel: settings.serviceLevel ?? fallbackServiceLevel,
      serviceKind,
      explanation: `No order suggested: planning ${what}. Order by hand until the item plans again.`,
      detailJson: null,
    },
    diagnosticsJson: null,
    error: error.slice(0, 4000),
  };
}
