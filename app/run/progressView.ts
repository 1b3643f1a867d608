/**
 * How the command line shows a run's progress: on a terminal one line redrawn in place (a bar,
 * counts, rate, time left); otherwise (a pipe, a log file) a plain line at most every few seconds
 * and at each change of phase, so logs stay short.
 */
import type { RunProgressEvent } from './progress';

function clock(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds)) return '--:--';
  const s = Math.max(0, Math.round(seconds));
  const m = Math.floor(s / 60);
  return `${m}:${String(s % 60).padStart(2, '0')}`;
}

export function progressText(p: RunProgressEvent): string {
  const pct = p.total > 0 ? (100 * p.done) / p.total : p.phase === 'done' ? 100 : 0;
  return `${p.phase} ${p.done}/${p.total} (${pct.toFixed(0)}%), ${p.itemsPerSecond.toFixed(1)} items/s, left ${clock(p.secondsLeft)}`;
}

export function progressBar(p: RunProgressEvent, width = 30): string {
  const frac = p.total > 0 ? Math.min(1, p.done / p.total) : p.phase === 'done' ? 1 : 0;
  const full = Math.round(frac * width);
  return `[${'#'.repeat(full)}${'.'.repeat(width - full)}] ${progressText(p)}`;
}

export interface ProgressView {
  update(p: RunProgressEvent): void;
  end(): void;
}

export function progressView(out: NodeJS.WriteStream, plainEveryMs = 2000): ProgressView {
  if (out.isTTY) {
    let drawn = false;
    return {
      update(p) {
        out.write(`\r${progressBar(p)}\u001b[K`);
        drawn = true;
      },
      end() {
        if (drawn) out.write('\n');
      },
    };
  }
  let last = 0;
  let lastPhase = '';
  return {
    update(p) {
      const now = Date.now();
      if (p.phase !== lastPhase || now - last >= plainEveryMs) {
        out.write(`${progressText(p)}\n`);
        last = now;
        lastPhase = p.phase;
      }
    },
    end() {},
  };
}
