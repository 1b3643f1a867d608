/**
 * How the screens reach the service: in the Electron shell the preload exposes the typed API object
 * as `window.provision`; in the browser preview every call is a POST to /api/<method> carrying the
 * token the preview printed in its address. The screens see one ProvisionApi either way.
 */
import type { ApiMethod, ProvisionApi } from '../../app/api/contract';

declare global {
  interface Window {
    provision?: ProvisionApi;
  }
}

export class ApiError extends Error {
  override name = 'ApiError';
}

const METHODS: ApiMethod[] = [
  'storeInfo',
  'listItems',
  'reviewQueue',
  'getItem',
  'previewImport',
  'commitImport',
  'startRun',
  'runProgress',
  'cancelRun',
  'decide',
  'listOrders',
  'setOrderQty',
  'exportOrdersCsv',
  'getSettings',
  'saveSettings',
];

function tokenFromAddress(): string {
  const fromQuery = new URLSearchParams(window.location.search).get('token');
  if (fromQuery) {
    sessionStorage.setItem('provision-token', fromQuery);
    return fromQuery;
  }
  return sessionStorage.getItem('provision-token') ?? '';
}

export function httpApi(token: string, base = ''): ProvisionApi {
  const api: Record<string, (...args: unknown[]) => Promise<unknown>> = {};
  for (const method of METHODS) {
    api[method] = async (...args: unknown[]) => {
      const res = await fetch(`${base}/api/${method}`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-provision-token': token },
        body: JSON.stringify(args),
      });
      const body = (await res.json().catch(() => ({ error: `HTTP ${res.status}` }))) as {
        result?: unknown;
        error?: string;
      };
      if (!res.ok) throw new ApiError(body.error ?? `HTTP ${res.status}`);
      return body.result;
    };
  }
  return api as unknown as ProvisionApi;
}

export function connectApi(): ProvisionApi {
  if (window.provision) return window.provision;
  return httpApi(tokenFromAddress());
}
