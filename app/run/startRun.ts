/**
 * The weekly planning run over a whole store: every active item's history, settings, inventory
 * position and planner overrides go through the per-item planning function on a pool of worker
 * threads (one per core); the main thread only reads, coordinates and writes.
 *
 * - Reuse: an item whose input fingerprint (./fingerprint) equals the one in the latest complete
 *   run is carried over unless `force` (or unless it failed there: then it is tried again).
 * - `items`: only the listed SKUs are planned; every other active item is carried over from the
 *   latest run as it stands (so the new run is still complete).
 * - Error tracking: the forecasts earlier runs made for weeks that have since been observed go to
 *   the engine as `pastForecasts` (it computes bias and Trigg's tracking signal from them).
 * - One run is one transaction: results are gathered in memory and written by writeRun at the end,
 *   so a run that fails, is cancelled or is killed leaves the previous run complete and readable.
 * - An item that fails gets the run's failed-item line and a flag; it never aborts the run.
 */
import { abcClasses, annualConsumptionValue } from '../../core/replenish/abc';
import { getWeeklyHistoriesById, lastDemandWeek } from '../store/demand';
import { listActiveItems } from '../store/items';
import { getAllOverrides, toPlanningOverrides } from '../store/overrides';
import {
  getLatestRun,
  getPastForecasts,
  getRunFingerprints,
  type ItemRunRecord,
  type PlannedEntry,
  type ReusedEntry,
  recordUnfinishedRun,
  writeRun,
} from '../store/runs';
import { getWorkspaceSettings } from '../store/settings';
import { getAllPositions } from '../store/stock';
import { nowIso, openStore, type Store } from '../store/store';
import { planningCodeVersion } from './codeVersion';
import { compactHistory } from './compactHistory';
import { failedItemRecord } from './failedItem';
import { inputFingerprint } from './fingerprint';
import { runPool } from './pool';
import { ProgressTracker, type RunProgressEvent } from './progress';
import type { RunItemInput } from './runInput';
import { siblingModule } from './tsWorker';

export interface RunOptions {
  /** Plan only these SKUs (the rest are carried over). */
  items?: readonly string[];
  /** Plan every selected item even when its inputs did not change. */
  force?: boolean;
  /** Worker threads; default the machine's cores. */
  workers?: number;
  actor?: string;
  /** The per-item function's module and export (default ./planTask, `planTask`). */
  taskModule?: URL;
  taskExport?: string;
  batchSize?: number;
  itemTimeoutMs?: number;
}

export interface RunSummary {
  status: 'complete' | 'cancelled' | 'failed';
  /** The new run's id (complete), the id of the recorded unfinished run, or null. */
  runId: number | null;
  previousRunId: number | null;
  total: number;
  planned: number;
  reused: number;
  failed: number;
  /** Items with at least one flag among those planned in this run. */
  flagged: number;
  seconds: number;
  /** Planned items per second of planning (reading and writing excluded). */
  itemsPerSecond: number;
  /** Mean time per planned item inside the workers, ms. */
  msPerItem: number;
  error: string | null;
}

export interface RunHandle {
  cancel(): void;
  done: Promise<RunSummary>;
}

const PROGRESS_EVERY_MS = 200;

/** Let the event loop run (timers, I/O, a cancel) between the synchronous store reads. */
const yieldToLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Mean of the last 52 observed weeks (null weeks skipped), 0 when none. */
function recentMeanWeekly(qty: readonly (number | null)[]): number {
  let s = 0;
  let n = 0;
  for (let i = qty.length - 1; i >= 0 && i >= qty.length - 52; i--) {
    const v = qty[i];
    if (v !== null) {
      s += v;
      n++;
    }
  }
  return n > 0 ? s / n : 0;
}

export function startRun(
  storeOrPath: Store | string,
  options: RunOptions = {},
  onProgress: (p: RunProgressEvent) => void = () => {},
): RunHandle {
  let cancelled = false;
  let cancelPool: (() => void) | null = null;
  const cancel = () => {
    cancelled = true;
    cancelPool?.();
  };
  const done = execute(
    storeOrPath,
    options,
    onProgress,
    () => cancelled,
    (c) => {
      cancelPool = c;
    },
  );
  return { cancel, done };
}

async function execute(
  storeOrPath: Store | string,
  options: RunOptions,
  onProgress: (p: RunProgressEvent) => void,
  isCancelled: () => boolean,
  setCancel: (c: () => void) => void,
): Promise<RunSummary> {
  const t0 = Date.now();
  const startedAt = nowIso();
  const own = typeof storeOrPath === 'string';
  let store: Store | null = null;
  const summary: RunSummary = {
    status: 'failed',
    runId: null,
    previousRunId: null,
    total: 0,
    planned: 0,
    reused: 0,
    failed: 0,
    flagged: 0,
    seconds: 0,
    itemsPerSecond: 0,
    msPerItem: 0,
    error: null,
  };
  let settingsSnapshot: unknown = null;
  let tracker: ProgressTracker | null = null;
  const emit = (phase: RunProgressEvent['phase']) => {
    try {
      onProgress(
        tracker?.snapshot(phase) ?? {
          phase,
          done: 0,
          total: summary.total,
          itemsPerSecond: 0,
          secondsLeft: null,
          elapsedSeconds: (Date.now() - t0) / 1000,
        },
      );
    } catch {
      // A failing progress listener must not break the run.
    }
  };
  try {
    await yieldToLoop(); // startRun returns at once; the reading starts on the next turn
    store = own ? openStore(storeOrPath as string) : (storeOrPath as Store);
    emit('preparing');
    const workspace = getWorkspaceSettings(store);
    const codeVersion = planningCodeVersion();
    settingsSnapshot = {
      workspace,
      codeVersion,
      force: options.force === true,
      items: options.items ?? null,
    };
    const items = listActiveItems(store, workspace);
    const wanted = options.items ? new Set(options.items) : null;
    if (wanted) {
      const known = new Set(items.map((i) => i.sku));
      const unknown = [...wanted].filter((s) => !known.has(s));
      if (unknown.length > 0) {
        throw new Error(`--items: no active item with SKU ${unknown.map((s) => `'${s}'`).join(', ')}`);
      }
    }
    const through = lastDemandWeek(store);
    await yieldToLoop();
    const histories = getWeeklyHistoriesById(store, { activeOnly: true, to: through });
    await yieldToLoop();
    const positions = getAllPositions(store);
    const overrides = getAllOverrides(store);
    const previous = getLatestRun(store);
    summary.previousRunId = previous?.id ?? null;
    const prevPrints = previous ? getRunFingerprints(store, previous.id) : new Map();
    const past = through ? getPastForecasts(store, through) : new Map();

    const abc = abcClasses(
      items.map((it) => ({
        sku: it.sku,
        annualValue: annualConsumptionValue(recentMeanWeekly(histories.get(it.id)?.qty ?? []), it.unitCost),
      })),
      workspace.abcCutoffs,
    );

    const toPlan: {
      itemId: number;
      fingerprint: string;
      input: RunItemInput | null;
      settings: RunItemInput['settings'];
    }[] = [];
    const reused: ReusedEntry[] = [];
    let sinceYield = 0;
    for (const it of items) {
      if (++sinceYield === 500) {
        sinceYield = 0;
        await yieldToLoop();
        if (isCancelled()) throw new CancelledRun();
      }
      const h = histories.get(it.id) ?? { weekStart: [], qty: [] };
      const { id, placeholder: _placeholder, ...settings } = it;
      const o = overrides.get(it.sku);
      const input: RunItemInput = {
        settings,
        history: compactHistory(h),
        position: positions.get(it.sku) ?? { onHand: 0, onOrder: 0, backorders: 0, asOf: null },
        overrides: o ? toPlanningOverrides(o) : { forcedModel: null, adjustments: [], safetyStock: null },
        workspace,
        abcClass: abc.get(it.sku) ?? null,
        pastForecasts: (past.get(id) ?? []).map(
          (f: { weekStart: string; mean: number; se: number; step: number }) => ({
            week: f.weekStart,
            mean: f.mean,
            se: f.se,
            step: f.step,
          }),
        ),
      };
      const fingerprint = inputFingerprint(codeVersion, input);
      const prev = prevPrints.get(id);
      if (wanted && !wanted.has(it.sku)) {
        // Not asked for: carry the latest result over as it stands (none yet: nothing to carry).
        if (prev !== undefined && previous) reused.push({ itemId: id, fromRunId: previous.id });
        continue;
      }
      // An item that failed last time is tried again even with the same inputs (the failure may
      // have been the machine's: a hang, a worker out of memory).
      if (!options.force && prev?.fingerprint === fingerprint && prev.status !== 'failed' && previous) {
        reused.push({ itemId: id, fromRunId: previous.id });
        continue;
      }
      toPlan.push({ itemId: id, fingerprint, input, settings });
    }
    summary.total = toPlan.length + reused.length;
    summary.reused = reused.length;
    tracker = new ProgressTracker(summary.total, reused.length);
    if (isCancelled()) throw new CancelledRun();

    const records: (ItemRunRecord | null)[] = new Array(toPlan.length).fill(null);
    let workerMs = 0;
    let lastEmit = 0;
    const planStart = Date.now();
    emit('planning');
    if (toPlan.length > 0) {
      const pool = runPool<RunItemInput, ItemRunRecord>({
        taskModule: options.taskModule ?? siblingModule('planTask', import.meta.url),
        taskExport: options.taskExport ?? 'planTask',
        count: toPlan.length,
        input: (i) => {
          const input = toPlan[i].input;
          if (!input) throw new Error(`planning run: input of item ${toPlan[i].itemId} asked for twice`);
          // Sent once (a retry after a worker's death re-sends it, so keep it until answered).
          return input;
        },
        onOutcome: (o) => {
          const entry = toPlan[o.index];
          const settings = entry.input!.settings;
          workerMs += o.ms;
          records[o.index] = o.ok
            ? o.value
            : failedItemRecord(settings, o.kind, o.error, workspace.serviceLevel);
          entry.input = null; // answered: let the input go
          tracker!.advance();
          const now = Date.now();
          if (now - lastEmit >= PROGRESS_EVERY_MS) {
            lastEmit = now;
            emit('planning');
          }
        },
        workers: options.workers,
        batchSize: options.batchSize,
        itemTimeoutMs: options.itemTimeoutMs,
      });
      setCancel(() => pool.cancel());
      if (isCancelled()) pool.cancel();
      const state = await pool.done;
      if (state === 'cancelled' || isCancelled()) throw new CancelledRun();
    }
    const planSeconds = (Date.now() - planStart) / 1000;

    emit('writing');
    const planned: PlannedEntry[] = toPlan.map((p, i) => ({
      itemId: p.itemId,
      fingerprint: p.fingerprint,
      record: records[i]!,
    }));
    for (const p of planned) {
      if (p.record.status === 'failed') summary.failed++;
      if (p.record.flags.length > 0) summary.flagged++;
    }
    summary.planned = planned.length;
    const settingsById = new Map(toPlan.map((p) => [p.itemId, p.settings]));
    summary.runId = writeRun(
      store,
      { startedAt, actor: options.actor ?? null, settings: settingsSnapshot, note: null },
      planned,
      reused,
      (itemId, err) => {
        const settings = settingsById.get(itemId);
        if (!settings) return null;
        summary.failed++;
        summary.flagged++;
        const message = `the store refused its results: ${err instanceof Error ? err.message : String(err)}`;
        return failedItemRecord(settings, 'threw', message, workspace.serviceLevel);
      },
    );
    summary.status = 'complete';
    summary.itemsPerSecond = planSeconds > 0 ? planned.length / planSeconds : 0;
    summary.msPerItem = planned.length > 0 ? workerMs / planned.length : 0;
    summary.seconds = (Date.now() - t0) / 1000;
    emit('done');
  } catch (err) {
    const wasCancel = err instanceof CancelledRun || isCancelled();
    summary.status = wasCancel ? 'cancelled' : 'failed';
    summary.error = wasCancel ? null : err instanceof Error ? err.message : String(err);
    summary.planned = 0;
    summary.failed = 0;
    summary.flagged = 0;
    summary.seconds = (Date.now() - t0) / 1000;
    if (store) {
      try {
        summary.runId = recordUnfinishedRun(store, {
          startedAt,
          actor: options.actor ?? null,
          settings: settingsSnapshot,
          note: wasCancel ? 'cancelled before it finished; nothing was written' : `failed: ${summary.error}`,
          status: wasCancel ? 'cancelled' : 'failed',
          itemsTotal: summary.total,
        });
      } catch {
        summary.runId = null;
      }
    }
    emit(wasCancel ? 'cancelled' : 'failed');
  } finally {
    if (own && store) store.close();
  }
  return summary;
}

class CancelledRun extends Error {
  constructor() {
    super('cancelled');
  }
}
