/**
 * The service handle and a data version shared by every screen: after an import, a run or a
 * decision the version goes up and the screens fetch again what they show.
 */
import { createContext, useCallback, useContext, useEffect, useState } from 'react';
import type { ProvisionApi } from '../../app/api/contract';

interface ApiState {
  api: ProvisionApi;
  version: number;
  changed: () => void;
}

export const ApiContext = createContext<ApiState | null>(null);

export function useApi(): ApiState {
  const state = useContext(ApiContext);
  if (!state) throw new Error('useApi outside ApiContext');
  return state;
}

export type Loaded<T> = { data: T | null; error: string | null; loading: boolean; reload: () => void };

/** Loads `fetcher()` and again whenever the data version or one of `deps` changes. */
export function useLoad<T>(fetcher: (api: ProvisionApi) => Promise<T>, deps: unknown[]): Loaded<T> {
  const { api, version } = useApi();
  const [data, setData] = useState<T | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(true);
  const [tick, setTick] = useState(0);
  const reload = useCallback(() => setTick((t) => t + 1), []);
  // biome-ignore lint/correctness/useExhaustiveDependencies: the caller names what the fetch depends on
  useEffect(() => {
    let live = true;
    setLoading(true);
    fetcher(api).then(
      (d) => {
        if (!live) return;
        setData(d);
        setError(null);
        setLoading(false);
      },
      (e: unknown) => {
        if (!live) return;
        setError(e instanceof Error ? e.message : String(e));
        setLoading(false);
      },
    );
    return () => {
      live = false;
    };
  }, [api, version, tick, ...deps]);
  return { data, error, loading, reload };
}
