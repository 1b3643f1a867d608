// @vitest-environment jsdom
/** Order editing: a new quantity needs whole units ≥ 0 and a reason; only then is it saved. */
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { OrderLine } from '../../../app/api/contract';
import { checkOrderEdit, OrderTable } from '../../../renderer/src/components/OrderTable';

afterEach(cleanup);

const line: OrderLine = {
  sku: 'FL-001',
  description: 'Wheat flour type 550, 25 kg',
  supplier: 'Northmill Grain',
  orderQty: 120,
  suggestedQty: 120,
  casePacks: 3,
  reorderPoint: 180,
  orderUpTo: 260,
  safetyStock: 40,
  intervalForecast: 220,
  intervalSd: 24,
  serviceLevel: 0.95,
  serviceKind: 'cycle',
  flags: [],
  explanation: ['Order-up-to 260 minus position 140 = 120.'],
  edit: null,
};

describe('checkOrderEdit', () => {
  it('accepts whole units of 0 or more with a reason, and nothing else', () => {
    expect(checkOrderEdit('80', 'promotion ended')).toEqual({ qty: 80, reason: 'promotion ended' });
    expect(checkOrderEdit('0', 'stop ordering')).toEqual({ qty: 0, reason: 'stop ordering' });
    expect(checkOrderEdit('-5', 'x y z')).toEqual({ error: 'Enter a quantity of 0 or more.' });
    expect(checkOrderEdit('12,5', 'half case')).toEqual({ error: 'Order whole units.' });
    expect(checkOrderEdit('ten', 'reason')).toEqual({ error: 'Enter a quantity of 0 or more.' });
    expect(checkOrderEdit('10', ' ')).toEqual({ error: 'Say why the quantity changes (a few words).' });
  });
});

describe('OrderTable', () => {
  it('edits a quantity: refuses without a reason, saves with one', async () => {
    const onSave = vi.fn(async () => {});
    render(<OrderTable supplier="Northmill Grain" lines={[line]} onSave={onSave} />);
    fireEvent.click(screen.getByRole('button', { name: 'Change quantity of FL-001' }));
    fireEvent.change(screen.getByLabelText('New quantity for FL-001'), { target: { value: '150' } });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    });
    expect(onSave).not.toHaveBeenCalled();
    expect(screen.getByRole('alert').textContent).toBe('Say why the quantity changes (a few words).');
    fireEvent.change(screen.getByLabelText('Reason for changing FL-001'), {
      target: { value: 'bakery fair' },
    });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    });
    expect(onSave).toHaveBeenCalledWith('FL-001', 150, 'bakery fair');
    expect(screen.queryByLabelText('New quantity for FL-001')).toBeNull();
  });

  it('shows the suggested quantity beside an edited one', () => {
    render(
      <OrderTable
        supplier="Northmill Grain"
        lines={[
          { ...line, orderQty: 150, edit: { qty: 150, reason: 'bakery fair', at: '2026-02-02T09:00:00Z' } },
        ]}
        onSave={async () => {}}
      />,
    );
    const row = screen.getAllByRole('row')[1];
    expect(row.textContent).toContain('150');
    expect(row.textContent).toContain('(suggested 120)');
    expect(row.textContent).toContain('edited: bakery fair');
  });
});
