/**
 * The screens' addresses live in the location hash (#/items/SKU, #/review, …), so the same build
 * works from the loopback server and from the shell's app:// origin, and the back key works.
 */
import { useEffect, useState } from 'react';

export type Tab = 'items' | 'review' | 'orders' | 'import' | 'settings';

export interface Route {
  tab: Tab;
  sku: string | null;
}

const TABS: Tab[] = ['items', 'review', 'orders', 'import', 'settings'];

export function parseRoute(hash: string): Route {
  const parts = hash.replace(/^#\/?/, '').split('/');
  const tab = (TABS as string[]).includes(parts[0]) ? (parts[0] as Tab) : 'items';
  const sku = parts[1] ? decodeURIComponent(parts.slice(1).join('/')) : null;
  return { tab, sku };
}

export function routeHref(tab: Tab, sku?: string | null): string {
  return sku ? `#/${tab}/${encodeURIComponent(sku)}` : `#/${tab}`;
}

export function navigate(tab: Tab, sku?: string | null): void {
  const href = routeHref(tab, sku);
  if (window.location.hash !== href) window.location.hash = href;
}

export function useRoute(): Route {
  const [route, setRoute] = useState(() => parseRoute(window.location.hash));
  useEffect(() => {
    const on = () => setRoute(parseRoute(window.location.hash));
    window.addEventListener('hashchange', on);
    return () => window.removeEventListener('hashchange', on);
  }, []);
  return route;
}
