/**
 * Progress of a planning run: items done out of the total, the rate in items per second over the
 * last few seconds (so the estimate follows a change of pace instead of the run's whole average),
 * and the time left at that rate.
 */

export interface RunProgressEvent {
  phase: 'preparing' | 'planning' | 'writing' | 'done' | 'cancelled' | 'failed';
  done: number;
  total: number;
  /** Items planned (not reused) per second over the recent window; 0 before any. */
  itemsPerSecond: number;
  /** Null while the rate is unknown. */
  secondsLeft: number | null;
  elapsedSeconds: number;
}

const WINDOW_MS = 5000;

export class ProgressTracker {
  private readonly t0 = Date.now();
  private readonly marks: { t: number; done: number }[] = [];
  done = 0;

  constructor(
    readonly total: number,
    /** Items counted as done at the start (reused ones) that do not enter the rate. */
    preDone = 0,
  ) {
    this.done = preDone;
    this.marks.push({ t: this.t0, done: preDone });
  }

  advance(n = 1): void {
    this.done += n;
    const t = Date.now();
    const last = this.marks[this.marks.length - 1];
    if (t - last.t >= 100) this.marks.push({ t, done: this.done });
    while (this.marks.length > 2 && t - this.marks[1].t > WINDOW_MS) this.marks.shift();
  }

  snapshot(phase: RunProgressEvent['phase']): RunProgressEvent {
    const t = Date.now();
    const first = this.marks[0];
    const span = (t - first.t) / 1000;
    const rate = span > 0.05 ? (this.done - first.done) / span : 0;
    const left = this.total - this.done;
    return {
      phase,
      done: this.done,
      total: this.total,
      itemsPerSecond: rate,
      secondsLeft: left === 0 ? 0 : rate > 0 ? left / rate : null,
      elapsedSeconds: (t - this.t0) / 1000,
    };
  }
}
