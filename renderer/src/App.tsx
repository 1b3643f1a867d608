/**
 * The planner's window: the store in use, the planning run, five tabs (Items, Needs review,
 * Orders, Import, Settings) and the standing reminder that suggestions are advisory.
 */
import { useCallback, useMemo, useState } from 'react';
import type { ProvisionApi } from '../../app/api/contract';
import { ApiContext, useLoad } from './api-context';
import { RunBar } from './components/RunBar';
import { routeHref, type Tab, useRoute } from './route';
import { ImportScreen } from './screens/ImportScreen';
import { ItemsScreen } from './screens/ItemsScreen';
import { OrdersScreen } from './screens/OrdersScreen';
import { ReviewScreen } from './screens/ReviewScreen';
import { SettingsScreen } from './screens/SettingsScreen';

const TABS: { tab: Tab; label: string }[] = [
  { tab: 'items', label: 'Items' },
  { tab: 'review', label: 'Needs review' },
  { tab: 'orders', label: 'Orders' },
  { tab: 'import', label: 'Import' },
  { tab: 'settings', label: 'Settings' },
];

function StoreLine() {
  const info = useLoad((api) => api.storeInfo(), []);
  if (!info.data) return <span className="store-line">{info.error ?? 'Opening store…'}</span>;
  const d = info.data;
  return (
    <span className="store-line" title={d.path}>
      {d.path.split(/[\\/]/).pop()} · {d.activeItems} active items · weeks {d.firstWeek ?? '–'} to{' '}
      {d.lastWeek ?? '–'}
      {d.lastRun ? ` · last plan #${d.lastRun.id}` : ' · not planned yet'}
    </span>
  );
}

export function App({ api }: { api: ProvisionApi }) {
  const [version, setVersion] = useState(0);
  const changed = useCallback(() => setVersion((v) => v + 1), []);
  const state = useMemo(() => ({ api, version, changed }), [api, version, changed]);
  const route = useRoute();

  return (
    <ApiContext.Provider value={state}>
      <div className="app">
        <header className="topbar">
          <div className="brand">
            <span className="brand-name">Provision</span>
            <StoreLine />
          </div>
          <RunBar />
        </header>
        <nav className="tabs" aria-label="Screens">
          {TABS.map((t) => (
            <a key={t.tab} href={routeHref(t.tab)} aria-current={route.tab === t.tab ? 'page' : undefined}>
              {t.label}
            </a>
          ))}
        </nav>
        <main className="screen" id="screen">
          {route.tab === 'items' && <ItemsScreen sku={route.sku} />}
          {route.tab === 'review' && <ReviewScreen />}
          {route.tab === 'orders' && <OrdersScreen />}
          {route.tab === 'import' && <ImportScreen />}
          {route.tab === 'settings' && <SettingsScreen />}
        </main>
        <footer className="advisory">
          Order quantities, safety stocks and reorder points are suggestions computed from past sales; the
          planner decides. Shelf life, storage and food-safety rules follow local regulations and your own
          judgement.
        </footer>
      </div>
    </ApiContext.Provider>
  );
}
