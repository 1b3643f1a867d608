/**
 * The Electron preload (sandboxed, context-isolated): exposes exactly one object to the page,
 * `window.provision`, with one function per method of the typed API. Each forwards its arguments
 * over the one IPC channel; the main process validates them before the service sees them. Nothing
 * else of Electron or Node reaches the page.
 */
import { contextBridge, ipcRenderer } from 'electron';
import type { ProvisionApi } from './api/contract';
import type { IpcAnswer } from './transport/ipc';
import { API_METHODS } from './transport/validate-call';

const IPC_CHANNEL = 'provision:call';

const api = Object.fromEntries(
  API_METHODS.map((method) => [
    method,
    async (...args: unknown[]) => {
      const answer = (await ipcRenderer.invoke(IPC_CHANNEL, method, args)) as IpcAnswer;
      if (!answer.ok) throw new Error(answer.message);
      return answer.value;
    },
  ]),
) as unknown as ProvisionApi;

contextBridge.exposeInMainWorld('provision', Object.freeze(api));
