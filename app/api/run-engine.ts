/** The planning run (app/run/startRun) as the service drives it: start, follow progress, cancel. */
import { startRun } from '../run/startRun';
import type { RunEngine } from './service';

export function storeRunEngine(actor: string): RunEngine {
  return {
    start(store, options, onProgress) {
      const handle = startRun(store, { force: options.force, actor }, (p) => {
        onProgress({
          done: p.done,
          total: p.total,
          itemsPerSecond: p.itemsPerSecond,
          secondsLeft: p.secondsLeft,
        });
      });
      return {
        cancel: () => handle.cancel(),
        done: handle.done.then((s) => ({
          runId: s.runId,
          state: s.status === 'complete' ? ('done' as const) : s.status,
          message: s.error,
        })),
      };
    },
  };
}
