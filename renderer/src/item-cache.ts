/**
 * A small cache of opened items for one data version: a click (or the keyboard landing on a row)
 * starts the fetch at once, before the address changes, and going back to an item just seen costs
 * nothing. Emptied whenever the data version changes (import, run, decision).
 */
import type { ItemDetail, ProvisionApi } from '../../app/api/contract';

const MAX = 50;
let cacheVersion = -1;
const cache = new Map<string, Promise<ItemDetail>>();

export function fetchItem(api: ProvisionApi, version: number, sku: string): Promise<ItemDetail> {
  if (version !== cacheVersion) {
    cache.clear();
    cacheVersion = version;
  }
  let p = cache.get(sku);
  if (!p) {
    p = api.getItem(sku);
    p.catch(() => cache.delete(sku));
    cache.set(sku, p);
    if (cache.size > MAX) cache.delete(cache.keys().next().value as string);
  }
  return p;
}
