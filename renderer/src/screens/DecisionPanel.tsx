/**
 * The planner's decisions on one item: accept the model, pick another candidate, adjust the
 * forecast, fix the safety stock, mark reviewed. Each needs a reason and goes to the audit log.
 */
import { type FormEvent, useState } from 'react';
import type { Decision, ItemDetail } from '../../../app/api/contract';
import { AdjustmentForm } from '../components/AdjustmentForm';
import { parseNumber } from '../components/adjustment-form';
import { units } from '../format';

export function DecisionPanel({
  detail,
  decide,
}: {
  detail: ItemDetail;
  decide: (d: Decision) => Promise<void>;
}) {
  const r = detail.result;
  const [reason, setReason] = useState('');
  const [candidate, setCandidate] = useState('');
  const [ss, setSs] = useState(
    detail.overrides.safetyStock == null ? '' : String(detail.overrides.safetyStock),
  );
  const [ssError, setSsError] = useState<string | null>(null);
  const forced = detail.overrides.forcedModel;
  const others = r ? r.candidates.filter((c) => !c.chosen) : [];
  const weeks =
    r && r.forecast.length > 0
      ? { first: r.forecast[0].week, last: r.forecast[r.forecast.length - 1].week }
      : null;

  const fixSs = async (e: FormEvent) => {
    e.preventDefault();
    const v = ss.trim() === '' ? null : parseNumber(ss);
    if (ss.trim() !== '' && (v === null || v < 0)) {
      setSsError('Enter a number of units, 0 or more, or leave empty to let the run compute it.');
      return;
    }
    if (reason.trim().length < 3) {
      setSsError('Say why in the reason box (a few words), for the audit log.');
      return;
    }
    setSsError(null);
    await decide({ kind: 'fix-safety-stock', units: v, reason: reason.trim() });
  };

  return (
    <div className="decisions">
      <label className="wide">
        Reason for the decision
        <input
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          placeholder="e.g. checked with sales, pattern is real"
        />
      </label>
      <div className="button-row">
        <button
          type="button"
          disabled={!r}
          onClick={() => decide({ kind: 'accept-model', reason: reason.trim() })}
        >
          Accept this model
        </button>
        <button
          type="button"
          onClick={() => decide({ kind: 'mark-reviewed', reviewed: !detail.reviewed, reason: reason.trim() })}
        >
          {detail.reviewed ? 'Mark as not reviewed' : 'Mark reviewed'}
        </button>
      </div>
      {forced && (
        <p className="note">
          Model fixed by the planner: ARIMA({forced.order.p},{forced.order.d},{forced.order.q})
          {forced.seasonalHarmonics > 0 ? ` with ${forced.seasonalHarmonics} annual harmonics` : ''}.
        </p>
      )}
      {others.length > 0 && (
        <div className="button-row">
          <label>
            Use another candidate
            <select value={candidate} onChange={(e) => setCandidate(e.target.value)}>
              <option value="">choose…</option>
              {others.map((c) => (
                <option key={c.label} value={c.label}>
                  {c.label} (AICc {c.aicc === null ? '–' : c.aicc.toFixed(1)})
                </option>
              ))}
            </select>
          </label>
          <button
            type="button"
            disabled={candidate === ''}
            onClick={() => decide({ kind: 'pick-candidate', candidate, reason: reason.trim() })}
          >
            Use for the next run
          </button>
        </div>
      )}
      <form className="button-row" onSubmit={fixSs} aria-label="Fix the safety stock">
        <label>
          Safety stock fixed by hand (units)
          <input
            inputMode="decimal"
            value={ss}
            onChange={(e) => setSs(e.target.value)}
            placeholder="computed by the run"
          />
        </label>
        <button type="submit">{ss.trim() === '' ? 'Let the run compute it' : 'Fix safety stock'}</button>
        {ssError && (
          <span className="field-error" role="alert">
            {ssError}
          </span>
        )}
      </form>
      <h3>Forecast adjustments</h3>
      {(detail.overrides.adjustments ?? []).length > 0 ? (
        <ul className="plain">
          {(detail.overrides.adjustments ?? []).map((a, i) => (
            <li key={`${a.from}-${a.to}-${a.kind}-${a.value}-${a.reason}`}>
              {a.from} to {a.to}:{' '}
              {a.kind === 'percent'
                ? `${a.value > 0 ? '+' : ''}${a.value}%`
                : `${a.value > 0 ? '+' : ''}${units(a.value)} units/week`}{' '}
              — {a.reason}{' '}
              <button
                type="button"
                className="link"
                onClick={() =>
                  decide({ kind: 'remove-adjustment', index: i, reason: reason.trim() || 'removed' })
                }
              >
                remove
              </button>
            </li>
          ))}
        </ul>
      ) : (
        <p className="muted">None.</p>
      )}
      <AdjustmentForm
        forecastWeeks={weeks}
        onSubmit={(adjustment) => decide({ kind: 'adjust-forecast', adjustment })}
      />
    </div>
  );
}
