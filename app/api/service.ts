/**
 * The service behind the planner's screens: implements the contract (./contract) over the store
 * (app/store), the import (app/import) and the planning run (app/run). The transports (IPC, HTTP)
 * call it and know nothing else; it never knows which of them called. All statistics shown on the
 * screens are computed here or below — the renderer only draws them.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir, userInfo } from 'node:os';
import { basename, join } from 'node:path';
import type { WorkspaceSettings } from '../../core/plan/types';
import {
  addAdjustment,
  appendAudit,
  editOrderQty,
  getAllOverrides,
  getAllWeeklyHistories,
  getItemSettings,
  getOverrides,
  getPosition,
  getWeeklyHistory,
  getWorkspaceSettings,
  listAudit,
  listStoredItems,
  markReviewed,
  openStore,
  putWorkspaceSettings,
  removeAdjustment,
  type Store,
  setForcedModel,
  setSafetyStock,
} from '../store';
import { auditInWords } from './audit-words';
import type {
  Decision,
  ImportOutcome,
  ImportPreview,
  ImportRequest,
  ItemDetail,
  ItemRow,
  ProvisionApi,
  ReviewEntry,
  RunProgress,
  StoreInfo,
  SupplierOrders,
} from './contract';
import type { ResultsSource } from './results';
import { ServiceError } from './service-error';

export interface ServiceOptions {
  storePath: string;
  /** Who the audit log names; defaults to the login name. */
  actor?: string;
  results: (store: Store) => ResultsSource;
  imports: ImportEngine;
  runs: RunEngine;
}

export interface ImportEngine {
  preview(store: Store, path: string, request: ImportRequest): Promise<ImportPreview>;
  commit(store: Store, path: string, request: ImportRequest): Promise<ImportOutcome>;
}

export interface RunHandle {
  cancel(): void;
  done: Promise<{ runId: number | null; state: 'done' | 'cancelled' | 'failed'; message: string | null }>;
}

export interface RunEngine {
  start(
    store: Store,
    options: { force: boolean },
    onProgress: (p: Omit<RunProgress, 'state' | 'runId' | 'message'>) => void,
  ): RunHandle;
}

export interface ProvisionService extends ProvisionApi {
  readonly store: Store;
  close(): Promise<void>;
}

const IDLE: RunProgress = {
  state: 'idle',
  done: 0,
  total: 0,
  itemsPerSecond: 0,
  secondsLeft: null,
  runId: null,
  message: null,
};

export function defaultActor(): string {
  try {
    return userInfo().username || 'planner';
  } catch {
    return 'planner';
  }
}

export function createService(options: ServiceOptions): ProvisionService {
  const store = openStore(options.storePath, { create: true });
  const actor = options.actor ?? defaultActor();
  let results = options.results(store);
  let progress: RunProgress = { ...IDLE };
  let running: RunHandle | null = null;
  let rowsCache: ItemRow[] | null = null;
  /** First and last week of the store's demand, found while building the overview rows. */
  let span: { first: string | null; last: string | null } = { first: null, last: null };

  const changed = () => {
    rowsCache = null;
    results = options.results(store);
  };

  const withTempFile = async <T>(request: ImportRequest, fn: (path: string) => Promise<T>): Promise<T> => {
    const dir = mkdtempSync(join(tmpdir(), 'provision-import-'));
    // Keep the planner's file name so every message names the file they picked.
    const path = join(dir, basename(request.fileName).replace(/[^\w.\- ]/g, '_') || 'import.csv');
    try {
      writeFileSync(path, request.content, 'utf8');
      return await fn(path);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  };

  const requireSku = (sku: string) => {
    const s = getItemSettings(store, sku);
    if (!s) throw new ServiceError(`unknown SKU '${sku}'`);
    return s;
  };

  const service: ProvisionService = {
    store,

    async storeInfo(): Promise<StoreInfo> {
      const rows = await service.listItems();
      const run = results.latestRun();
      return {
        path: store.path,
        items: rows.length,
        activeItems: rows.filter((i) => i.active).length,
        firstWeek: span.first,
        lastWeek: span.last,
        lastRun: run,
      };
    },

    async listItems(): Promise<ItemRow[]> {
      if (rowsCache) return rowsCache;
      const items = listStoredItems(store);
      const histories = getAllWeeklyHistories(store);
      const overrides = getAllOverrides(store);
      const summary = results.summaries();
      let first: string | null = null;
      let last: string | null = null;
      rowsCache = items.map((it) => {
        const h = histories.get(it.sku);
        if (h && h.weekStart.length > 0) {
          if (first === null || h.weekStart[0] < first) first = h.weekStart[0];
          const l = h.weekStart[h.weekStart.length - 1];
          if (last === null || l > last) last = l;
        }
        const s = summary.get(it.sku);
        const observed = h ? h.qty.filter((q) => q !== null).length : 0;
        return {
          sku: it.sku,
          description: it.description,
          supplier: it.supplier,
          active: it.active,
          weeks: observed,
          lastWeek: h && h.weekStart.length > 0 ? h.weekStart[h.weekStart.length - 1] : null,
          model: s?.model ?? null,
          flagCount: s?.flags.length ?? 0,
          worstSeverity: s && s.flags.length > 0 ? worst(s.flags.map((f) => f.severity)) : null,
          orderQty: s?.orderQty ?? null,
          reviewed: overrides.get(it.sku)?.reviewedAt != null,
        };
      });
      span = { first, last };
      return rowsCache;
    },

    async reviewQueue(): Promise<ReviewEntry[]> {
      return results.reviewQueue();
    },

    async getItem(sku: string): Promise<ItemDetail> {
      const settings = requireSku(sku);
      const history = getWeeklyHistory(store, sku) ?? { weekStart: [], qty: [], stockoutWeeks: [] };
      const o = getOverrides(store, sku);
      return {
        settings,
        position: getPosition(store, sku),
        history: { weekStart: history.weekStart, qty: history.qty },
        result: results.item(sku, history.weekStart),
        overrides: { forcedModel: o.forcedModel, adjustments: o.adjustments, safetyStock: o.safetyStock },
        reviewed: o.reviewedAt !== null,
        audit: listAudit(store, { sku, limit: 200 }).map(auditInWords),
      };
    },

    async previewImport(request: ImportRequest): Promise<ImportPreview> {
      return withTempFile(request, (path) => options.imports.preview(store, path, request));
    },

    async commitImport(request: ImportRequest): Promise<ImportOutcome> {
      if (running)
        throw new ServiceError('a planning run is going; import when it has finished or cancel it');
      const outcome = await withTempFile(request, (path) => options.imports.commit(store, path, request));
      if (outcome.status === 'imported') changed();
      return outcome;
    },

    async startRun(opts: { force: boolean }): Promise<RunProgress> {
      if (running) return progress;
      progress = { ...IDLE, state: 'running' };
      const handle = options.runs.start(store, opts, (p) => {
        progress = { ...progress, ...p, state: 'running' };
      });
      running = handle;
      handle.done.then(
        (r) => {
          progress = { ...progress, state: r.state, runId: r.runId, message: r.message, secondsLeft: 0 };
          running = null;
          changed();
        },
        (err: unknown) => {
          progress = {
            ...progress,
            state: 'failed',
            message: err instanceof Error ? err.message : String(err),
          };
          running = null;
        },
      );
      return progress;
    },

    async runProgress(): Promise<RunProgress> {
      return progress;
    },

    async cancelRun(): Promise<RunProgress> {
      running?.cancel();
      return progress;
    },

    async decide(sku: string, d: Decision): Promise<ItemDetail> {
      requireSku(sku);
      const who = { actor, reason: 'reason' in d ? d.reason : null };
      try {
        switch (d.kind) {
          case 'accept-model': {
            const r = results.item(sku, []);
            if (!r?.candidates.some((c) => c.chosen))
              throw new ServiceError(
                `${sku}: no fitted model to accept (not planned yet, or a fallback forecast)`,
              );
            setForcedModel(store, sku, { ...r.model }, who);
            break;
          }
          case 'pick-candidate': {
            const r = results.item(sku, []);
            const c = r?.candidates.find((x) => x.label === d.candidate);
            if (!c) throw new ServiceError(`${sku}: no candidate model '${d.candidate}' in the latest run`);
            setForcedModel(
              store,
              sku,
              { order: c.order, seasonalHarmonics: c.seasonalHarmonics, includeMean: c.includeMean },
              who,
            );
            break;
          }
          case 'adjust-forecast':
            addAdjustment(store, sku, d.adjustment, { actor, reason: d.adjustment.reason });
            break;
          case 'remove-adjustment':
            removeAdjustment(store, sku, d.index, who);
            break;
          case 'fix-safety-stock':
            setSafetyStock(store, sku, d.units, who);
            break;
          case 'mark-reviewed':
            markReviewed(store, sku, {
              ...who,
              reviewed: d.reviewed,
              runId: results.latestRun()?.id ?? null,
            });
            break;
        }
      } catch (err) {
        if (err instanceof ServiceError) throw err;
        throw new ServiceError(err instanceof Error ? err.message : String(err));
      }
      rowsCache = null;
      return service.getItem(sku);
    },

    async listOrders(): Promise<SupplierOrders[]> {
      return groupBySupplier(results.orderLines());
    },

    async setOrderQty(sku: string, qty: number, reason: string): Promise<SupplierOrders[]> {
      requireSku(sku);
      const run = results.latestRun();
      if (!run) throw new ServiceError('no planning run yet: there are no order lines to edit');
      try {
        editOrderQty(store, sku, run.id, qty, { actor, reason });
      } catch (err) {
        throw new ServiceError(err instanceof Error ? err.message : String(err));
      }
      changed();
      return groupBySupplier(results.orderLines());
    },

    async exportOrdersCsv(): Promise<{ fileName: string; csv: string }> {
      const run = results.latestRun();
      if (!run) throw new ServiceError('no planning run yet: nothing to export');
      return { fileName: `orders-run-${run.id}.csv`, csv: results.ordersCsv() };
    },

    async getSettings(): Promise<WorkspaceSettings> {
      return getWorkspaceSettings(store);
    },

    async saveSettings(settings: WorkspaceSettings): Promise<WorkspaceSettings> {
      const before = getWorkspaceSettings(store);
      const after = store.transaction(() => {
        const next = putWorkspaceSettings(store, settings);
        appendAudit(store, {
          actor,
          sku: null,
          action: 'change-settings',
          before,
          after: next,
          reason: null,
        });
        return next;
      });
      changed();
      return after;
    },

    async close(): Promise<void> {
      if (running) {
        running.cancel();
        await running.done.catch(() => undefined);
      }
      store.close();
    },
  };
  // Build the overview once in the background, so the first page load finds it ready.
  setTimeout(() => {
    service.listItems().catch(() => undefined);
  }, 0).unref();
  return service;
}

function worst(sev: ('info' | 'warning' | 'critical')[]): 'info' | 'warning' | 'critical' {
  if (sev.includes('critical')) return 'critical';
  if (sev.includes('warning')) return 'warning';
  return 'info';
}

function groupBySupplier(lines: import('./contract').OrderLine[]): SupplierOrders[] {
  const by = new Map<string, import('./contract').OrderLine[]>();
  for (const l of lines) {
    const key = l.supplier ?? '(no supplier)';
    const list = by.get(key);
    if (list) list.push(l);
    else by.set(key, [l]);
  }
  return [...by.entries()]
    .sort((a, b) => a[0].localeCompare(b[0]))
    .map(([supplier, list]) => ({
      supplier,
      lines: list.sort((a, b) => b.orderQty - a.orderQty || a.sku.localeCompare(b.sku)),
      totalUnits: list.reduce((s, l) => s + l.orderQty, 0),
    }));
}
