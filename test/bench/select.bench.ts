/**
 * `npm run bench -- select`: the measured figures of the automatic model choice (issue 3).
 *   reference   — share of the 200 fixture series where our choice (d = 0) is the true order, beside
 *                 base R's exhaustive AICc grid with exclusions (test/reference/fixtures/selection-grid.json)
 *   calibration — 80% / 95% coverage of 1- and 4-step intervals on 500 simulated ARMA series
 *   seasonal    — Fourier terms chosen on annual-cycle series, 13-week MASE against the non-seasonal
 *                 choice, and the share not chosen on series without a cycle
 *   robustness  — 10,000 random awkward series through choice, forecast, lead-time sum and diagnosis
 *   speed       — automatic fit of 500 three-year weekly CSV files end to end through the CLI (`fit`
 *                 with no --order), minus the same call on one file, divided by 499; in-process
 *                 chooseModel + forecast + diagnosis beside it
 * Pick parts with SELECT_PARTS=reference,speed; scale the counts with SELECT_SCALE=0.1.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRng } from '../../core/arma/random';
import { simulateArma } from '../../core/arma/simulate';
import { diagnoseChoice } from '../../core/diagnose/diagnoseChoice';
import { chooseModel } from '../../core/select/chooseModel';
import { forecastChoice } from '../../core/select/forecastChoice';
import { calibration, robustness, seasonality } from '../unit/select/acceptance';
import { randomArmaModel, weeklySeries, weeksFrom } from '../unit/select/seriesGenerators';
import { cliCommand } from './cliCommand';

const root = join(import.meta.dirname, '..', '..');
const parts = (process.env.SELECT_PARTS ?? 'reference,calibration,seasonal,robustness,speed').split(',');
const scale = Number(process.env.SELECT_SCALE ?? 1);
const count = (n: number): number => Math.max(1, Math.round(n * scale));
const pct = (x: number): string => `${(100 * x).toFixed(1)}%`;
const out = (s: string): void => {
  process.stdout.write(`${s}\n`);
};

if (parts.includes('reference')) {
  const fx = JSON.parse(readFileSync(join(root, 'test/reference/fixtures/selection-grid.json'), 'utf8')) as {
    series: { data: number[]; trueOrder: { p: number; q: number }; rChoiceCorrect: boolean }[];
  };
  const t0 = performance.now();
  let ours = 0;
  let r = 0;
  for (const s of fx.series) {
    const c = chooseModel(s.data, weeksFrom(s.data.length), { d: 0, seasonal: false });
    if (c.order.p === s.trueOrder.p && c.order.q === s.trueOrder.q) ours++;
    if (s.rChoiceCorrect) r++;
  }
  const ms = (performance.now() - t0) / fx.series.length;
  out(
    `reference: true order found — ours (stepwise, d = 0) ${ours}/${fx.series.length} (${pct(ours / fx.series.length)}), base R exhaustive grid ${r}/${fx.series.length} (${pct(r / fx.series.length)}); ${ms.toFixed(1)} ms per series in-process`,
  );
}

if (parts.includes('calibration')) {
  const t0 = performance.now();
  const c = calibration(count(500), 20261201);
  const se = (x: number): string => (100 * Math.sqrt((x * (1 - x)) / c.series)).toFixed(1);
  out(
    `calibration (${c.series} series): 1-step 80% ${pct(c.cover1_80)}, 95% ${pct(c.cover1_95)}; 4-step 80% ${pct(c.cover4_80)}, 95% ${pct(c.cover4_95)} (target 77–83% / 93–97%); ${((performance.now() - t0) / 1000).toFixed(0)} s`,
  );
  // The true model on the same held-out values: what perfect knowledge of each process covers on
  // these draws. The gap between the two lines is the model choice's; the gap between this line and
  // 80% / 95% is the sample's (binomial standard error beside each figure).
  out(
    `calibration, true model on the same draws: 1-step 80% ${pct(c.oracle1_80)}, 95% ${pct(c.oracle1_95)}; 4-step 80% ${pct(c.oracle4_80)}, 95% ${pct(c.oracle4_95)} (sampling s.e. ±${se(0.8)} / ±${se(0.95)} points); differenced (d ≥ 1) on ${c.differenced} stationary series, their 1-step 95% coverage ${pct(c.differencedCover1_95)}`,
  );
  // The chance each chosen interval covers its held-out value, from the true conditional law
  // (the held-out noise integrated out; the true model scores the nominal level exactly).
  out(
    `calibration, coverage probability of the same intervals (held-out noise integrated out): 1-step 80% ${pct(c.exact1_80)}, 95% ${pct(c.exact1_95)}; 4-step 80% ${pct(c.exact4_80)}, 95% ${pct(c.exact4_95)}`,
  );
}

if (parts.includes('seasonal')) {
  const t0 = performance.now();
  const s = seasonality(count(100), 4242);
  out(
    `seasonal (${s.series} + ${s.series} series, 156 weeks): chosen on cycle series ${pct(s.chosenOnSeasonal)}; 13-week MASE chosen ${s.maseChosen.toFixed(3)} vs non-seasonal ${s.maseNonSeasonal.toFixed(3)}; not chosen without a cycle ${pct(s.notChosenOnPlain)} (target ≥ 90%); ${((performance.now() - t0) / 1000).toFixed(0)} s`,
  );
}

if (parts.includes('robustness')) {
  const t0 = performance.now();
  const r = robustness(count(10_000), 777);
  out(
    `robustness (${r.series} awkward series): exceptions ${r.exceptions}, non-finite ${r.nonFinite}, without a flag list ${r.withoutFlags}; kinds ${JSON.stringify(r.kinds)}${r.firstProblem ? `; first problem: ${r.firstProblem}` : ''}; ${((performance.now() - t0) / 1000).toFixed(0)} s`,
  );
}

if (parts.includes('speed')) {
  const files = count(500);
  const dir = mkdtempSync(join(tmpdir(), 'provision-select-bench-'));
  const rng = createRng(99);
  const paths: string[] = [];
  const series: { y: Float64Array; w: string[] }[] = [];
  mkdirSync(dir, { recursive: true });
  for (let i = 0; i < files; i++) {
    const n = 156;
    const w = weeksFrom(n);
    // A mix like a wholesaler's range: a third with an annual cycle, the rest ARMA around a level.
    const y =
      i % 3 === 0
        ? weeklySeries(rng, n, true)
        : (() => {
            const m = randomArmaModel(rng);
            return simulateArma(m, n, rng).map((v) => Math.max(0, v));
          })();
    const lines = ['week,qty'];
    for (let t = 0; t < n; t++) lines.push(`${w[t]},${y[t].toFixed(2)}`);
    const p = join(dir, `item-${String(i).padStart(4, '0')}.csv`);
    writeFileSync(p, `${lines.join('\n')}\n`);
    paths.push(p);
    series.push({ y, w });
  }
  // In-process: choice + 26-week forecast + diagnosis, after a warm-up.
  for (let i = 0; i < Math.min(20, files); i++) chooseModel(series[i].y, series[i].w);
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  let seasonalChosen = 0;
  for (const s of series) {
    const c = chooseModel(s.y, s.w);
    forecastChoice(c, 26);
    diagnoseChoice(c, s.w);
    if (c.seasonalHarmonics > 0) seasonalChosen++;
  }
  const inProcess = (performance.now() - t0) / files;
  const cpu = process.cpuUsage(cpu0);
  const cpuPerItem = (cpu.user + cpu.system) / 1000 / files;
  out(
    `speed in-process: ${inProcess.toFixed(2)} ms wall, ${cpuPerItem.toFixed(2)} ms CPU per item (chooseModel + forecast + diagnosis, ${files} three-year items, ${seasonalChosen} with annual terms)`,
  );
  const cli = join(root, 'app/cli/fit.ts');
  if (existsSync(cli)) {
    // Wall time, and the child's CPU time (user + system, from bash's `time`), which a machine
    // shared with other jobs inflates far less than wall time.
    const script = `TIMEFORMAT='%U %S'; time ("$@" > /dev/null)`;
    const run = (args: string[]): { wall: number; cpu: number } => {
      const t = performance.now();
      const r = spawnSync('bash', ['-c', script, 'bash', ...cliCommand(), 'fit', ...args], {
        cwd: root,
        encoding: 'utf8',
        maxBuffer: 1 << 30,
      });
      const wall = performance.now() - t;
      const lines = (r.stderr ?? '').trim().split('\n');
      const [u, sy] = (lines[lines.length - 1] ?? '').split(' ').map(Number);
      if (r.status !== 0) out(`cli exit ${r.status}: ${(r.stderr ?? '').slice(0, 400)}`);
      return { wall, cpu: 1000 * ((u || 0) + (sy || 0)) };
    };
    const a = run([paths[0]]);
    const b = run([paths[0]]);
    const one = { wall: Math.min(a.wall, b.wall), cpu: Math.min(a.cpu, b.cpu) };
    const all = run(paths);
    const per = (x: number, y: number): string => ((x - y) / (files - 1)).toFixed(2);
    out(
      `speed through the CLI: wall (${(all.wall / 1000).toFixed(2)} s for ${files} files − ${(one.wall / 1000).toFixed(2)} s for one) / ${files - 1} = ${per(all.wall, one.wall)} ms per item; CPU ${per(all.cpu, one.cpu)} ms per item (target ≤ 15 ms)`,
    );
  } else {
    out('speed through the CLI: app/cli/fit.ts does not exist yet — in-process figure only');
  }
  rmSync(dir, { recursive: true, force: true });
}
