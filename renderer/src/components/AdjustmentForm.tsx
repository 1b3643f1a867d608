/** The form for a manual forecast adjustment: a percentage or a quantity per week over a range of weeks. */
import { type FormEvent, useId, useState } from 'react';
import type { ForecastAdjustment } from '../../../app/api/contract';
import { type AdjustmentErrors, type AdjustmentInput, checkAdjustment } from './adjustment-form';

export function AdjustmentForm(props: {
  forecastWeeks: { first: string; last: string } | null;
  onSubmit: (a: ForecastAdjustment) => Promise<void> | void;
}) {
  const id = useId();
  const [input, setInput] = useState<AdjustmentInput>({
    from: props.forecastWeeks?.first ?? '',
    to: props.forecastWeeks?.last ?? '',
    kind: 'percent',
    value: '',
    reason: '',
  });
  const [errors, setErrors] = useState<AdjustmentErrors>({});
  const [busy, setBusy] = useState(false);
  const set = (k: keyof AdjustmentInput) => (e: { target: { value: string } }) =>
    setInput((s) => ({ ...s, [k]: e.target.value }));

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const checked = checkAdjustment(input, props.forecastWeeks);
    if ('errors' in checked) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    setBusy(true);
    try {
      await props.onSubmit(checked.adjustment);
      setInput((s) => ({ ...s, value: '', reason: '' }));
    } finally {
      setBusy(false);
    }
  };

  const err = (k: keyof AdjustmentInput) =>
    errors[k] ? (
      <span className="field-error" id={`${id}-${k}-err`} role="alert">
        {errors[k]}
      </span>
    ) : null;
  const described = (k: keyof AdjustmentInput) => (errors[k] ? `${id}-${k}-err` : undefined);

  return (
    <form className="form-grid" onSubmit={submit} aria-label="Adjust the forecast" noValidate>
      <label>
        From week
        <input
          type="date"
          value={input.from}
          onChange={set('from')}
          aria-invalid={!!errors.from}
          aria-describedby={described('from')}
        />
      </label>
      <label>
        To week
        <input
          type="date"
          value={input.to}
          onChange={set('to')}
          aria-invalid={!!errors.to}
          aria-describedby={described('to')}
        />
      </label>
      <label>
        Kind
        <select value={input.kind} onChange={set('kind')}>
          <option value="percent">per cent</option>
          <option value="quantity">units per week</option>
        </select>
      </label>
      <label>
        Change
        <input
          inputMode="decimal"
          value={input.value}
          onChange={set('value')}
          placeholder={input.kind === 'percent' ? 'e.g. +15' : 'e.g. -20'}
          aria-invalid={!!errors.value}
          aria-describedby={described('value')}
        />
      </label>
      <label className="wide">
        Reason
        <input
          value={input.reason}
          onChange={set('reason')}
          placeholder="e.g. regional promotion"
          aria-invalid={!!errors.reason}
          aria-describedby={described('reason')}
        />
      </label>
      <div className="wide">
        {err('from')}
        {err('to')}
        {err('value')}
        {err('reason')}
      </div>
      <button type="submit" disabled={busy}>
        Apply adjustment
      </button>
    </form>
  );
}
