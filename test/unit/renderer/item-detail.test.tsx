// @vitest-environment jsdom
/**
 * The item panel shows what the service computed (charts replaced: jsdom has no canvas) and sends
 * the planner's decisions through the API with their reasons.
 */
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { ItemDetail, ProvisionApi } from '../../../app/api/contract';
import { ApiContext } from '../../../renderer/src/api-context';
import { ItemDetailPanel } from '../../../renderer/src/screens/ItemDetailPanel';

vi.mock('../../../renderer/src/charts', () => ({
  ForecastChart: (p: { forecast: unknown[]; reorderPoint: number | null; orderUpTo: number | null }) => (
    <div data-testid="forecast-chart">
      {p.forecast.length} weeks; reorder {p.reorderPoint}; up to {p.orderUpTo}
    </div>
  ),
  AcfChart: (p: { acf: number[]; band: number }) => (
    <div data-testid="acf-chart">
      {p.acf.length} lags; band {p.band.toFixed(3)}
    </div>
  ),
  RootsChart: (p: { ar: unknown[]; ma: unknown[] }) => (
    <div data-testid="roots-chart">
      {p.ar.length} AR; {p.ma.length} MA
    </div>
  ),
}));

afterEach(cleanup);

const detail: ItemDetail = {
  settings: {
    sku: 'YE-014',
    description: 'Fresh yeast block, 500 g',
    supplier: 'Leaven & Co',
    unit: 'block',
    casePack: 20,
    moq: 40,
    leadTimeWeeks: 1,
    leadTimeSdWeeks: 0,
    reviewPeriodWeeks: 1,
    serviceLevel: 0.95,
    serviceKind: 'cycle',
    unitCost: 1.2,
    holdingRate: 0.25,
    orderCost: 15,
    shelfLifeWeeks: 3,
    active: true,
  },
  position: { onHand: 60, onOrder: 0, backorders: 0, asOf: '2026-01-26' },
  history: { weekStart: ['2026-01-12', '2026-01-19', '2026-01-26'], qty: [100, 90, 110] },
  result: {
    runId: 3,
    model: { label: 'ARMA(1,0)', order: { p: 1, d: 0, q: 0 }, seasonalHarmonics: 0, includeMean: true },
    fitted: [null, 98, 93],
    forecast: [
      {
        step: 1,
        week: '2026-02-02',
        mean: 104,
        se: 9,
        lower80: 92.5,
        upper80: 115.5,
        lower95: 86.4,
        upper95: 121.6,
      },
    ],
    residualAcf: [0.1, -0.05, 0.02],
    residualCount: 150,
    acfBand: 0.16,
    arRoots: [{ re: 2.5, im: 0 }],
    maRoots: [],
    candidates: [
      {
        label: 'ARMA(1,0)',
        order: { p: 1, d: 0, q: 0 },
        seasonalHarmonics: 0,
        includeMean: true,
        aicc: 812.4,
        chosen: true,
      },
      {
        label: 'ARMA(0,1)',
        order: { p: 0, d: 0, q: 1 },
        seasonalHarmonics: 0,
        includeMean: true,
        aicc: 815.9,
        chosen: false,
      },
    ],
    flags: [],
    diagnostics: [],
    order: {
      sku: 'YE-014',
      description: 'Fresh yeast block, 500 g',
      supplier: 'Leaven & Co',
      orderQty: 160,
      suggestedQty: 160,
      casePacks: 8,
      reorderPoint: 140,
      orderUpTo: 220,
      safetyStock: 30,
      intervalForecast: 208,
      intervalSd: 18,
      serviceLevel: 0.95,
      serviceKind: 'cycle',
      flags: [],
      explanation: ['Rounded up to 8 case packs of 20.'],
      edit: null,
    },
    overridesApplied: ['forecast +10% from 2026-02-02 to 2026-02-23 (fair)'],
  },
  overrides: { forcedModel: null, adjustments: [], safetyStock: null },
  reviewed: false,
  audit: [],
};

function renderWith(api: Partial<ProvisionApi>) {
  return render(
    <ApiContext.Provider value={{ api: api as ProvisionApi, version: 0, changed: () => {} }}>
      <ItemDetailPanel sku="YE-014" />
    </ApiContext.Provider>,
  );
}

describe('ItemDetailPanel', () => {
  it('shows the service’s figures: charts fed as computed, order line, candidates, respected decisions', async () => {
    await act(async () => {
      renderWith({ getItem: async () => detail });
    });
    expect(screen.getByTestId('forecast-chart').textContent).toBe('1 weeks; reorder 140; up to 220');
    expect(screen.getByTestId('acf-chart').textContent).toBe('3 lags; band 0.160');
    expect(screen.getByTestId('roots-chart').textContent).toBe('1 AR; 0 MA');
    expect(screen.getByText(/160 units/).textContent).toContain('8 case packs');
    expect(screen.getByText('Rounded up to 8 case packs of 20.')).toBeTruthy();
    expect(screen.getByText('Respected: forecast +10% from 2026-02-02 to 2026-02-23 (fair)')).toBeTruthy();
    expect(screen.getAllByRole('row').map((r) => r.textContent)).toContain('ARMA(0,1)815.9');
  });

  it('sends a picked candidate and a fixed safety stock with the reason typed', async () => {
    const decide = vi.fn(async () => detail);
    await act(async () => {
      renderWith({ getItem: async () => detail, decide });
    });
    fireEvent.change(screen.getByLabelText('Reason for the decision'), {
      target: { value: 'spike in 2024 was a one-off' },
    });
    fireEvent.change(screen.getByLabelText('Use another candidate'), { target: { value: 'ARMA(0,1)' } });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Use for the next run' }));
    });
    expect(decide).toHaveBeenLastCalledWith('YE-014', {
      kind: 'pick-candidate',
      candidate: 'ARMA(0,1)',
      reason: 'spike in 2024 was a one-off',
    });
    fireEvent.change(screen.getByLabelText('Safety stock fixed by hand (units)'), {
      target: { value: '-3' },
    });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Fix safety stock' }));
    });
    expect(decide).toHaveBeenCalledTimes(1);
    expect(screen.getByRole('alert').textContent).toContain('0 or more');
    fireEvent.change(screen.getByLabelText('Safety stock fixed by hand (units)'), {
      target: { value: '45' },
    });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Fix safety stock' }));
    });
    expect(decide).toHaveBeenLastCalledWith('YE-014', {
      kind: 'fix-safety-stock',
      units: 45,
      reason: 'spike in 2024 was a one-off',
    });
  });
});
