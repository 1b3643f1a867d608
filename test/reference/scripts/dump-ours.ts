/**
 * Fit every ARMA grid fixture with our engine and write one JSON line per fit (our estimates), for
 * verify-ours.py to evaluate with statsmodels' exact likelihood: an independent check that where ours
 * beats both references, the log-likelihood we report is real.
 * Usage: npx tsx test/reference/scripts/dump-ours.ts OUT.jsonl
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fitArma } from '../../../core/arma';

interface Fit {
  id: string;
  series: string;
  order: { p: number; d: number; q: number };
  includeMean: boolean;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/arma-grid.json', import.meta.url), 'utf8')) as {
  series: { name: string; data: (number | null)[] }[];
  fits: Fit[];
};
const data = new Map(fixture.series.map((s) => [s.name, Float64Array.from(s.data, (v) => v ?? Number.NaN)]));
const lines: string[] = [];
for (const f of fixture.fits) {
  const fit = fitArma(data.get(f.series)!, { ...f.order, includeMean: f.includeMean });
  lines.push(
    JSON.stringify({
      id: f.id,
      loglik: fit.loglik,
      ar: fit.ar,
      ma: fit.ma,
      mean: fit.mean,
      sigma2: fit.sigma2,
      converged: fit.converged,
    }),
  );
}
writeFileSync(process.argv[2] ?? 'ours.jsonl', `${lines.join('\n')}\n`);
console.log(`wrote ${lines.length} fits`);
