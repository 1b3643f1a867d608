/** The items overview: a filter, the virtualized grid, and the opened item beside it. */
import { useDeferredValue, useMemo, useState } from 'react';
import { useApi, useLoad } from '../api-context';
import { ItemGrid } from '../components/ItemGrid';
import { StatusLines } from '../components/StatusLines';
import { fetchItem } from '../item-cache';
import { navigate } from '../route';
import { ItemDetailPanel } from './ItemDetailPanel';

export function ItemsScreen({ sku }: { sku: string | null }) {
  const { api, version } = useApi();
  const items = useLoad((a) => a.listItems(), []);
  const [filter, setFilter] = useState('');
  const [showInactive, setShowInactive] = useState(false);
  const deferred = useDeferredValue(filter);
  const rows = useMemo(() => {
    const all = showInactive ? (items.data ?? []) : (items.data ?? []).filter((r) => r.active);
    const f = deferred.trim().toLowerCase();
    if (f === '') return all;
    return all.filter(
      (r) =>
        r.sku.toLowerCase().includes(f) ||
        r.description.toLowerCase().includes(f) ||
        (r.supplier ?? '').toLowerCase().includes(f),
    );
  }, [items.data, deferred, showInactive]);

  return (
    <div className="split">
      <section className="list-pane" aria-label="Items">
        <div className="toolbar">
          <h1>Items</h1>
          <label className="filter">
            <span className="visually-hidden">Filter items</span>
            <input
              type="search"
              placeholder="Filter by SKU, description or supplier"
              value={filter}
              onChange={(e) => setFilter(e.target.value)}
            />
          </label>
          <label className="check">
            <input
              type="checkbox"
              checked={showInactive}
              onChange={(e) => setShowInactive(e.target.checked)}
            />{' '}
            inactive too
          </label>
          <span className="muted" data-testid="item-count">
            {items.data ? `${rows.length} of ${items.data.length}` : items.loading ? 'loading…' : ''}
          </span>
        </div>
        <StatusLines error={items.error} />
        {items.data && (
          <ItemGrid
            rows={rows}
            selected={sku}
            onOpen={(s) => {
              fetchItem(api, version, s);
              navigate('items', s);
            }}
            onActive={(s) => fetchItem(api, version, s)}
            label="Items overview"
          />
        )}
      </section>
      <section className="detail-pane" aria-label="Item detail">
        {sku ? (
          <ItemDetailPanel sku={sku} />
        ) : (
          <p className="muted pad">Open an item to see its forecast and order.</p>
        )}
      </section>
    </div>
  );
}
