/**
 * One supplier's order lines with the quantity editable: the planner types a new quantity and a
 * reason, the edit is saved (and logged) by the service; the suggested quantity stays visible.
 */
import { useState } from 'react';
import type { OrderLine } from '../../../app/api/contract';
import { units } from '../format';
import { parseNumber } from './adjustment-form';

export function checkOrderEdit(
  qtyText: string,
  reason: string,
): { qty: number; reason: string } | { error: string } {
  const qty = parseNumber(qtyText);
  if (qty === null || qty < 0) return { error: 'Enter a quantity of 0 or more.' };
  if (!Number.isInteger(qty)) return { error: 'Order whole units.' };
  if (reason.trim().length < 3) return { error: 'Say why the quantity changes (a few words).' };
  return { qty, reason: reason.trim() };
}

function OrderRow({
  line,
  onSave,
}: {
  line: OrderLine;
  onSave: (sku: string, qty: number, reason: string) => Promise<void>;
}) {
  const [editing, setEditing] = useState(false);
  const [qty, setQty] = useState(String(line.orderQty));
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);

  const save = async () => {
    const checked = checkOrderEdit(qty, reason);
    if ('error' in checked) {
      setError(checked.error);
      return;
    }
    setError(null);
    try {
      await onSave(line.sku, checked.qty, checked.reason);
      setEditing(false);
      setReason('');
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };

  return (
    <tr data-sku={line.sku} className={line.orderQty > 0 ? undefined : 'zero'}>
      <td className="mono">{line.sku}</td>
      <td>{line.description}</td>
      <td className="num">
        {editing ? (
          <input
            className="qty-input"
            inputMode="numeric"
            aria-label={`New quantity for ${line.sku}`}
            value={qty}
            onChange={(e) => setQty(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Enter') save();
              if (e.key === 'Escape') setEditing(false);
            }}
          />
        ) : (
          <strong>{units(line.orderQty)}</strong>
        )}
        {line.edit && !editing && (
          <span className="muted small"> (suggested {units(line.suggestedQty)})</span>
        )}
      </td>
      <td className="num">{units(line.casePacks)}</td>
      <td className="num">{units(line.reorderPoint)}</td>
      <td className="num">{units(line.orderUpTo)}</td>
      <td className="num">{units(line.safetyStock)}</td>
      <td className="small">
        {line.flags.length > 0 ? line.flags.join(', ') : ''}
        {line.edit && <div className="muted">edited: {line.edit.reason}</div>}
      </td>
      <td>
        {editing ? (
          <div className="inline-edit">
            <input
              aria-label={`Reason for changing ${line.sku}`}
              placeholder="reason"
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') save();
              }}
            />
            <button type="button" onClick={save}>
              Save
            </button>
            <button type="button" className="link" onClick={() => setEditing(false)}>
              Cancel
            </button>
            {error && (
              <span className="field-error" role="alert">
                {error}
              </span>
            )}
          </div>
        ) : (
          <button
            type="button"
            className="link"
            onClick={() => setEditing(true)}
            aria-label={`Change quantity of ${line.sku}`}
          >
            Change
          </button>
        )}
      </td>
    </tr>
  );
}

export function OrderTable(props: {
  supplier: string;
  lines: OrderLine[];
  onSave: (sku: string, qty: number, reason: string) => Promise<void>;
}) {
  return (
    <table className="table orders" aria-label={`Orders for ${props.supplier}`}>
      <thead>
        <tr>
          <th scope="col">SKU</th>
          <th scope="col">Description</th>
          <th scope="col" className="num">
            Order qty
          </th>
          <th scope="col" className="num">
            Case packs
          </th>
          <th scope="col" className="num">
            Reorder point
          </th>
          <th scope="col" className="num">
            Order-up-to
          </th>
          <th scope="col" className="num">
            Safety stock
          </th>
          <th scope="col">Flags</th>
          <th scope="col">Edit</th>
        </tr>
      </thead>
      <tbody>
        {props.lines.map((l) => (
          <OrderRow key={l.sku} line={l} onSave={props.onSave} />
        ))}
      </tbody>
    </table>
  );
}
