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

function tokenFromAddress(): string {
  const fromQuery = new URLSearchParams(window.location.search).get('token');
  if (fromQuery) {
    sessionStorage.setItem('provision-token', fromQuery);
    return fromQuery;
  }
  return sessionStorage.getItem('provision-token') ?? '';
}

/**
 * The API over HTTP: every method of ProvisionApi is a POST to /api/<method>. The method list lives
 * once, in app/transport/validate-call.ts, which the server checks every call against; here any
 * method name becomes a call (a Proxy), so the client never repeats the list.
 */
export function httpApi(token: string, base = ''): ProvisionApi {
  const call = async (method: ApiMethod, args: unknown[]): Promise<unknown> => {
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
  return new Proxy({} as ProvisionApi, {
    get(_target, name) {
      // Not a thenable, and no symbol-keyed methods.
      if (typeof name !== 'string' || name === 'then') return undefined;
      return (...args: unknown[]) => call(name as ApiMethod, args);
    },
  });
}

export function connectApi(): ProvisionApi {
  if (window.provision) return window.provision;
  return httpApi(tokenFromAddress());
}
