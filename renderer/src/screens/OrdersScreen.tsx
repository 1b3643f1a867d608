/** Orders to place, grouped by supplier, with quantity edits and the CSV export. */
import { useState } from 'react';
import { useApi, useLoad } from '../api-context';
import { OrderTable } from '../components/OrderTable';
import { StatusLines } from '../components/StatusLines';
import { units } from '../format';

export function OrdersScreen() {
  const { api, changed } = useApi();
  const orders = useLoad((a) => a.listOrders(), []);
  const [onlyToOrder, setOnlyToOrder] = useState(true);
  const [message, setMessage] = useState<string | null>(null);

  const save = async (sku: string, qty: number, reason: string) => {
    await api.setOrderQty(sku, qty, reason);
    setMessage(`${sku}: quantity set to ${units(qty)} and logged.`);
    changed();
  };

  const exportCsv = async () => {
    const { fileName, csv } = await api.exportOrdersCsv();
    const url = URL.createObjectURL(new Blob([csv], { type: 'text/csv;charset=utf-8' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = fileName;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
    setMessage(`Exported ${fileName}.`);
  };

  const groups = (orders.data ?? []).map((g) => ({
    ...g,
    shown: onlyToOrder ? g.lines.filter((l) => l.orderQty > 0) : g.lines,
  }));

  return (
    <section className="pad page" aria-labelledby="orders-h">
      <div className="toolbar">
        <h1 id="orders-h">Orders</h1>
        <label className="check">
          <input type="checkbox" checked={onlyToOrder} onChange={(e) => setOnlyToOrder(e.target.checked)} />{' '}
          Only lines with something to order
        </label>
        <button type="button" onClick={exportCsv} disabled={!orders.data || orders.data.length === 0}>
          Export order list (CSV)
        </button>
      </div>
      <p className="note">
        Suggestions only: check each quantity against what you know (promotions, storage room, shelf life)
        before you order.
      </p>
      <StatusLines note={message} error={orders.error} />
      {orders.data && orders.data.length === 0 && (
        <p className="muted">No order lines yet: run the plan first.</p>
      )}
      {groups.map((g) => (
        <section key={g.supplier} className="supplier" aria-label={g.supplier}>
          <h2>
            {g.supplier}{' '}
            <span className="muted">
              · {g.lines.filter((l) => l.orderQty > 0).length} lines to order · {units(g.totalUnits)} units
            </span>
          </h2>
          {g.shown.length > 0 ? (
            <OrderTable supplier={g.supplier} lines={g.shown} onSave={save} />
          ) : (
            <p className="muted">Nothing to order from this supplier now.</p>
          )}
        </section>
      ))}
    </section>
  );
}
