// @vitest-environment jsdom
/** The forecast-adjustment form: dates in order and overlapping the forecast, a non-zero number, a reason. */
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { AdjustmentForm } from '../../../renderer/src/components/AdjustmentForm';
import { checkAdjustment } from '../../../renderer/src/components/adjustment-form';

afterEach(cleanup);

const weeks = { first: '2026-02-02', last: '2026-07-27' };
const ok = {
  from: '2026-03-02',
  to: '2026-03-30',
  kind: 'percent' as const,
  value: '+15',
  reason: 'spring promotion',
};

describe('checkAdjustment', () => {
  it('turns a valid form into an adjustment (decimal comma accepted)', () => {
    expect(checkAdjustment(ok, weeks)).toEqual({
      adjustment: {
        from: '2026-03-02',
        to: '2026-03-30',
        kind: 'percent',
        value: 15,
        reason: 'spring promotion',
      },
    });
    expect(checkAdjustment({ ...ok, kind: 'quantity', value: '-12,5' }, weeks)).toEqual({
      adjustment: {
        from: '2026-03-02',
        to: '2026-03-30',
        kind: 'quantity',
        value: -12.5,
        reason: 'spring promotion',
      },
    });
  });

  it('names each wrong field', () => {
    const errors = (over: object) => {
      const r = checkAdjustment({ ...ok, ...over }, weeks);
      return 'errors' in r ? r.errors : {};
    };
    expect(errors({ to: '2026-02-23' })).toEqual({ to: 'The last week is before the first.' });
    expect(errors({ from: '' })).toEqual({ from: 'Choose the first week.' });
    expect(errors({ from: '2025-01-06', to: '2025-02-03' }).from).toContain('must overlap the forecast');
    expect(errors({ value: 'lots' })).toEqual({ value: 'Enter a number.' });
    expect(errors({ value: '0' })).toEqual({ value: 'An adjustment of zero changes nothing.' });
    expect(errors({ value: '-120' })).toEqual({ value: 'A cut of more than 100% is not possible.' });
    expect(errors({ kind: 'quantity', value: '-120' })).toEqual({});
    expect(errors({ reason: ' x ' })).toEqual({ reason: 'Say why (a few words), for the audit log.' });
  });
});

describe('AdjustmentForm', () => {
  it('sends nothing while a field is wrong, then the checked adjustment', async () => {
    const onSubmit = vi.fn(async () => {});
    render(<AdjustmentForm forecastWeeks={weeks} onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText('Change'), { target: { value: '20' } });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Apply adjustment' }));
    });
    expect(onSubmit).not.toHaveBeenCalled();
    expect(screen.getByRole('alert').textContent).toContain('Say why');
    expect(screen.getByLabelText('Reason').getAttribute('aria-invalid')).toBe('true');
    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'regional fair' } });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Apply adjustment' }));
    });
    expect(onSubmit).toHaveBeenCalledWith({
      from: '2026-02-02',
      to: '2026-07-27',
      kind: 'percent',
      value: 20,
      reason: 'regional fair',
    });
  });
});
