/**
 * The benchmark's sales file: week,sku,qty for N items × W weeks, seeded, written as a stream.
 */
import { once } from 'node:events';
import { createWriteStream } from 'node:fs';

function addWeeks(iso: string, n: number): string {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 7 * n);
  return d.toISOString().slice(0, 10);
}

/**
 * A seeded mix of demand patterns (our own, for timing only): AR(1), MA(1), white noise around a
 * level, a slow trend, and intermittent items (about one week in four with demand).
 */
export async function writeBenchSales(path: string, items: number, weeksCount: number): Promise<void> {
  let s = 20240101;
  const rand = () => {
    s = (Math.imul(1664525, s) + 1013904223) >>> 0; // LCG, Numerical Recipes constants
    return (s + 0.5) / 2 ** 32;
  };
  const gauss = () => Math.sqrt(-2 * Math.log(rand())) * Math.cos(2 * Math.PI * rand()); // Box–Muller
  const weeks = Array.from({ length: weeksCount }, (_, k) => addWeeks('2023-01-02', k));
  const out = createWriteStream(path);
  out.write('week,sku,qty\n');
  for (let i = 0; i < items; i++) {
    const sku = `B${String(i).padStart(5, '0')}`;
    const kind = i % 10;
    const level = 20 + 200 * rand();
    const sd = level * (0.1 + 0.2 * rand());
    let prev = 0;
    let prevE = 0;
    let chunk = '';
    for (let k = 0; k < weeksCount; k++) {
      const e = gauss() * sd;
      let y: number;
      if (kind < 3) {
        prev = 0.6 * prev + e; // AR(1) φ = 0.6
        y = level + prev;
      } else if (kind < 5) {
        y = level + e - 0.4 * prevE; // MA(1) θ = 0.4
      } else if (kind < 8) {
        y = level + e;
      } else if (kind < 9) {
        y = level * (0.7 + (0.6 * k) / weeksCount) + e;
      } else {
        y = rand() < 0.25 ? Math.max(1, level * 0.2 + e * 0.2) : 0;
      }
      prevE = e;
      chunk += `${weeks[k]},${sku},${Math.max(0, Math.round(y))}\n`;
    }
    if (!out.write(chunk)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
}
