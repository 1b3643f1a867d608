/**
 * Starts the planning run and follows it: a progress bar with counts, rate and time left, and a
 * cancel button. The work happens in the service's worker threads; this only polls the progress.
 */
import { useEffect, useRef, useState } from 'react';
import type { RunProgress } from '../../../app/api/contract';
import { useApi } from '../api-context';
import { dec1, units } from '../format';

export function timeLeft(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds)) return 'estimating time left';
  if (seconds < 60) return `about ${Math.max(1, Math.round(seconds))} s left`;
  return `about ${Math.round(seconds / 60)} min left`;
}

export function RunBar() {
  const { api, changed } = useApi();
  const [progress, setProgress] = useState<RunProgress | null>(null);
  const [error, setError] = useState<string | null>(null);
  const timer = useRef<number | null>(null);

  const poll = () => {
    if (timer.current !== null) window.clearTimeout(timer.current);
    timer.current = window.setTimeout(async () => {
      try {
        const p = await api.runProgress();
        setProgress(p);
        if (p.state === 'running') poll();
        else changed();
      } catch (e) {
        setError(e instanceof Error ? e.message : String(e));
      }
    }, 250);
  };

  // biome-ignore lint/correctness/useExhaustiveDependencies: once on mount, pick up a run already going
  useEffect(() => {
    api.runProgress().then(
      (p) => {
        setProgress(p);
        if (p.state === 'running') poll();
      },
      () => {},
    );
    return () => {
      if (timer.current !== null) window.clearTimeout(timer.current);
    };
  }, []);

  const start = async (force: boolean) => {
    setError(null);
    try {
      const p = await api.startRun({ force });
      setProgress(p);
      if (p.state === 'running') poll();
      else changed();
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };

  const cancel = async () => {
    try {
      setProgress(await api.cancelRun());
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };

  const running = progress?.state === 'running';
  return (
    <section className="runbar" aria-label="Planning run">
      {running && progress ? (
        <>
          <progress
            className="run-progress"
            max={Math.max(1, progress.total)}
            value={progress.done}
            aria-label="Planning progress"
          />
          <span className="run-text" aria-live="polite">
            {progress.total === 0
              ? 'Preparing the run…'
              : `${units(progress.done)} of ${units(progress.total)} items · ${dec1(progress.itemsPerSecond)} items/s · ${timeLeft(progress.secondsLeft)}`}
          </span>
          <button type="button" onClick={cancel}>
            Cancel run
          </button>
        </>
      ) : (
        <>
          <button type="button" className="primary" onClick={() => start(false)}>
            Plan all items
          </button>
          <button type="button" onClick={() => start(true)} title="Refit every item, even unchanged ones">
            Replan from scratch
          </button>
          {progress && progress.state !== 'idle' && (
            <span className="run-text" role="status">
              {progress.state === 'done' && `Last run planned ${units(progress.done)} items.`}
              {progress.state === 'cancelled' && 'Run cancelled; the previous plan is kept.'}
              {progress.state === 'failed' && `Run failed: ${progress.message ?? 'unknown error'}`}
            </span>
          )}
        </>
      )}
      {error && (
        <span className="error" role="alert">
          {error}
        </span>
      )}
    </section>
  );
}
