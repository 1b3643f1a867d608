/**
 * Reference test of the ARMA engine (issue 2, acceptance 1) against base R's
 * stats::arima(method = "ML") (R 4.2.2) and statsmodels 0.13.5 ARIMA, on the fixture
 * test/reference/fixtures/arma-grid.json made by test/reference/scripts/regenerate.sh.
 *
 * - On every fit our exact log-likelihood reaches the target (the better of the two references)
 *   within 1e-3; it may exceed it (those fits are printed).
 * - Where our optimum is R's (|ours − R| < 1e-3, R succeeded), the parameters agree within 1e-3 and
 *   the 12-step forecast means and standard errors within 0.1%.
 * - Our aic, aicc and bic follow from our loglik and parameter count (definitions below).
 *
 * "R's optimum" is R's own fit restarted at its estimate with optim reltol 1e-14 (r.polished in the
 * fixture) where the fixture accepted it, else R's default fit: R's default reltol 1e-8 leaves
 * parameters loose by up to ~1e-2 on flat likelihoods (see test/reference/README.md).
 * The 1e-3 on parameters is absolute for φ and θ (dimensionless), relative for σ², and in units of
 * the series' standard deviation for the mean (absolute 1e-3 on a mean near 900, as in Nile, is
 * below R's own precision: its default and polished means differ by 0.009 there).
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { fitArma, forecastArma } from '../../core/arma';

interface RefForecast {
  mean: number[];
  se: number[];
}
interface RFit {
  ok: boolean;
  error?: string | null;
  warnings: string[];
  loglik: number;
  ar: number[];
  ma: number[];
  mean?: number | null;
  sigma2: number;
  stderr?: { ar: (number | null)[]; ma: (number | null)[]; mean?: number | null };
  aic: number;
  nobs: number;
  nParams: number;
  arRootModuli: number[];
  maRootModuli: number[];
  forecast: RefForecast | null;
  polished?: RFit;
  polishedAccepted?: boolean;
  diffSeriesFit?: { ok: boolean; loglik: number; ar: number[]; ma: number[]; sigma2: number };
}
interface SmFit {
  ok: boolean;
  loglik: number | null;
}
interface FixtureFit {
  id: string;
  series: string;
  order: { p: number; d: number; q: number };
  includeMean: boolean;
  r: RFit;
  statsmodels: SmFit;
  target: number;
  targetBy: string;
  targetBasis: 'series' | 'diff';
}
interface FixtureSeries {
  name: string;
  data: (number | null)[];
}
interface Fixture {
  series: FixtureSeries[];
  fits: FixtureFit[];
}

const LOGLIK_TOL = 1e-3; // issue 2, acceptance 1
const PARAM_TOL = 1e-3; // issue 2, acceptance 1
const FORECAST_REL_TOL = 1e-3; // issue 2, acceptance 1: 0.1%
const HORIZON = 12; // the fixture's predict(fit, n.ahead = 12)

const fixture = JSON.parse(
  readFileSync(new URL('./fixtures/arma-grid.json', import.meta.url), 'utf8'),
) as Fixture;
const seriesByName = new Map(fixture.series.map((s) => [s.name, s]));

function toSeries(data: (number | null)[]): Float64Array {
  return Float64Array.from(data, (v) => (v === null ? Number.NaN : v));
}

function observedSd(y: Float64Array): number {
  let n = 0;
  let s = 0;
  let s2 = 0;
  for (const v of y) {
    if (Number.isNaN(v)) continue;
    n++;
    s += v;
    s2 += v * v;
  }
  const m = s / n;
  return Math.sqrt(Math.max(s2 / n - m * m, 0));
}

interface Outcome {
  fit: FixtureFit;
  y: Float64Array;
  loglik: number;
  ours?: ReturnType<typeof fitArma>;
  forecast?: { mean: Float64Array; se: Float64Array };
  error?: string;
}

const outcomes: Outcome[] = [];

beforeAll(() => {
  for (const fit of fixture.fits) {
    const y = toSeries(seriesByName.get(fit.series)!.data);
    try {
      const ours = fitArma(y, { ...fit.order, includeMean: fit.includeMean });
      const forecast = forecastArma(ours, HORIZON);
      outcomes.push({ fit, y, loglik: ours.loglik, ours, forecast });
    } catch (e) {
      outcomes.push({ fit, y, loglik: Number.NaN, error: String(e) });
    }
  }
  const reached = outcomes.filter((o) => o.loglik >= o.fit.target - LOGLIK_TOL);
  const beat = outcomes.filter((o) => o.loglik > o.fit.target + LOGLIK_TOL);
  console.log(
    `arma-reference: ${outcomes.length} fixtures, ours >= target - 1e-3 on ${reached.length}, ` +
      `ours > target + 1e-3 on ${beat.length}`,
  );
  if (beat.length > 0) {
    console.log(
      'ours beats the better reference by more than 1e-3 on:\n' +
        beat
          .map(
            (o) =>
              `  ${o.fit.id}: ours ${o.loglik.toFixed(4)}, target ${o.fit.target.toFixed(4)} (${o.fit.targetBy}), ` +
              `+${(o.loglik - o.fit.target).toFixed(4)}`,
          )
          .join('\n'),
    );
  }
});

/** R's fit that stands for "R's optimum" in parameter and forecast comparisons (see top comment). */
function rOptimum(f: FixtureFit): RFit {
  return f.r.polishedAccepted && f.r.polished ? f.r.polished : f.r;
}

/** R's log-likelihood on the same basis as ours: for d = 1, the ARMA fit to diff(y). */
function rLoglikOnOurBasis(f: FixtureFit): number | null {
  if (!f.r.ok) return null;
  if (f.targetBasis === 'diff') {
    const base = f.r.diffSeriesFit;
    return base?.ok ? base.loglik : null;
  }
  return rOptimum(f).loglik;
}

function sameOptimumAsR(o: Outcome): boolean {
  const rl = rLoglikOnOurBasis(o.fit);
  return rl !== null && o.ours !== undefined && Math.abs(o.loglik - rl) < LOGLIK_TOL;
}

describe('ARMA engine against base R stats::arima (ML) and statsmodels ARIMA (fixtures/arma-grid.json)', () => {
  it('covers the grid the issue asks for', () => {
    // p, q = 0..3 with a mean on every d = 0 series, plus d = 1 fits (issue 2, acceptance 1)
    const d0 = fixture.fits.filter((f) => f.order.d === 0);
    const d1 = fixture.fits.filter((f) => f.order.d === 1);
    expect(d0.length % 16).toBe(0);
    expect(d0.every((f) => f.includeMean)).toBe(true);
    expect(d1.length).toBeGreaterThan(0);
    expect(fixture.series.some((s) => s.data.includes(null))).toBe(true);
  });

  it('reaches the better reference log-likelihood within 1e-3 on every fit', () => {
    const short = outcomes
      .filter((o) => !(o.loglik >= o.fit.target - LOGLIK_TOL))
      .map(
        (o) =>
          `${o.fit.id}: ours ${o.error ?? o.loglik.toFixed(5)}, target ${o.fit.target.toFixed(5)} ` +
          `(${o.fit.targetBy}), short by ${(o.fit.target - o.loglik).toExponential(2)}`,
      );
    if (short.length > 0) console.log(`short of target on ${short.length} fits:\n  ${short.join('\n  ')}`);
    expect(short).toEqual([]);
  });

  it('counts only observed weeks: nobs and parameter count match R on every fit, gaps included', () => {
    const bad: string[] = [];
    for (const o of outcomes) {
      if (!o.ours || !o.fit.r.ok) continue;
      // R: fit$nobs = non-missing values after differencing; nParams = coefficients + σ²
      if (o.ours.nobs !== o.fit.r.nobs) bad.push(`${o.fit.id}: nobs ours ${o.ours.nobs}, R ${o.fit.r.nobs}`);
      if (o.ours.nparams !== o.fit.r.nParams) {
        bad.push(`${o.fit.id}: nparams ours ${o.ours.nparams}, R ${o.fit.r.nParams}`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('agrees with R on parameters within 1e-3 where both reach the same optimum', () => {
    const bad: string[] = [];
    const rShortOnRidge: string[] = [];
    const seRel: number[] = [];
    let compared = 0;
    for (const o of outcomes) {
      if (!sameOptimumAsR(o)) continue;
      const ours = o.ours!;
      const r = rOptimum(o.fit);
      compared++;
      const diffs: string[] = [];
      const cmp = (name: string, a: number, b: number, tol: number) => {
        if (!(Math.abs(a - b) <= tol)) diffs.push(`${name} ours ${a.toPrecision(7)} R ${b.toPrecision(7)}`);
      };
      for (let i = 0; i < r.ar.length; i++) cmp(`ar${i + 1}`, ours.ar[i], r.ar[i], PARAM_TOL);
      for (let i = 0; i < r.ma.length; i++) cmp(`ma${i + 1}`, ours.ma[i], r.ma[i], PARAM_TOL); // both ma-minus
      if (o.fit.includeMean && o.fit.order.d === 0) {
        cmp('mean', ours.mean ?? Number.NaN, r.mean ?? Number.NaN, PARAM_TOL * observedSd(o.y));
      }
      cmp('sigma2', ours.sigma2, r.sigma2, PARAM_TOL * r.sigma2);
      // Standard errors: printed for information only (R's come from a finite-difference Hessian
      // with step 1e-3, so they are not a 1e-3 reference).
      const pairs: [number, number | null | undefined][] = [
        ...ours.stderr.ar.map((v, i) => [v, r.stderr?.ar[i]] as [number, number | null | undefined]),
        ...ours.stderr.ma.map((v, i) => [v, r.stderr?.ma[i]] as [number, number | null | undefined]),
      ];
      if (ours.stderr.mean !== null) pairs.push([ours.stderr.mean, r.stderr?.mean]);
      for (const [a, b] of pairs)
        if (typeof b === 'number' && b > 0 && Number.isFinite(a)) seRel.push(Math.abs(a / b - 1));
      if (diffs.length === 0) continue;
      // Where ours is higher than R's optimum by more than 1e-5, R stopped short on a flat ridge
      // (typically an MA root on the unit circle with an AR root near it): ours is the closer
      // point to the maximum, so a parameter gap there is R's imprecision. Listed, not failed.
      const rl = rLoglikOnOurBasis(o.fit)!;
      const line = `${o.fit.id}: ${diffs.join(', ')} (ours − R loglik ${(o.loglik - rl).toExponential(2)})`;
      if (o.loglik > rl + 1e-5) rShortOnRidge.push(line);
      else bad.push(line);
    }
    console.log(
      `parameters compared with R's optimum on ${compared} fits, ${bad.length} disagree` +
        (rShortOnRidge.length > 0 ? `, ${rShortOnRidge.length} more where R stopped below ours` : ''),
    );
    seRel.sort((a, b) => a - b);
    const q = (f: number) => (seRel.length ? seRel[Math.floor(f * (seRel.length - 1))] : Number.NaN);
    console.log(
      `standard errors vs R's var.coef on ${seRel.length} estimates: |ours/R − 1| median ${q(0.5).toExponential(1)}, ` +
        `90% ${q(0.9).toExponential(1)}, ${seRel.filter((v) => v > 0.05).length} above 5%`,
    );
    if (bad.length > 0) console.log(`  ${bad.join('\n  ')}`);
    if (rShortOnRidge.length > 0) console.log(`  below ours (not failed):\n  ${rShortOnRidge.join('\n  ')}`);
    expect(compared).toBeGreaterThan(fixture.fits.length / 2);
    expect(bad).toEqual([]);
  });

  it("agrees with R's predict() on 12-step forecast means and standard errors within 0.1%", () => {
    const bad: string[] = [];
    let compared = 0;
    for (const o of outcomes) {
      if (!sameOptimumAsR(o)) continue;
      const ref = rOptimum(o.fit).forecast;
      if (!ref || !o.forecast) continue;
      compared++;
      const diffs: string[] = [];
      for (let h = 0; h < HORIZON; h++) {
        const m = o.forecast.mean[h];
        const s = o.forecast.se[h];
        if (!(Math.abs(m - ref.mean[h]) <= FORECAST_REL_TOL * Math.abs(ref.mean[h]))) {
          diffs.push(`mean[${h + 1}] ours ${m.toPrecision(7)} R ${ref.mean[h].toPrecision(7)}`);
        }
        if (!(Math.abs(s - ref.se[h]) <= FORECAST_REL_TOL * ref.se[h])) {
          diffs.push(`se[${h + 1}] ours ${s.toPrecision(7)} R ${ref.se[h].toPrecision(7)}`);
        }
      }
      if (diffs.length > 0)
        bad.push(`${o.fit.id}: ${diffs.slice(0, 4).join(', ')}${diffs.length > 4 ? ' …' : ''}`);
    }
    console.log(`forecasts compared with R on ${compared} fits, ${bad.length} disagree`);
    if (bad.length > 0) console.log(`  ${bad.join('\n  ')}`);
    expect(compared).toBeGreaterThan(fixture.fits.length / 2);
    expect(bad).toEqual([]);
  });

  it('reports aic, aicc and bic consistent with its own loglik and parameter count', () => {
    const bad: string[] = [];
    for (const o of outcomes) {
      if (!o.ours) continue;
      const { loglik, nparams: k, nobs: n, aic, aicc, bic } = o.ours;
      // Akaike (1974): −2 log L + 2k; Hurvich & Tsai (1989): AIC + 2k(k+1)/(n−k−1);
      // Schwarz (1978): −2 log L + k log n; k counts every estimated parameter, the mean and σ² included.
      const k0 = o.fit.order.p + o.fit.order.q + (o.fit.includeMean ? 1 : 0) + 1;
      const want = {
        k: k0,
        aic: -2 * loglik + 2 * k0,
        aicc: -2 * loglik + 2 * k0 + (2 * k0 * (k0 + 1)) / (n - k0 - 1),
        bic: -2 * loglik + Math.log(n) * k0,
      };
      const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));
      if (k !== want.k || !close(aic, want.aic) || !close(aicc, want.aicc) || !close(bic, want.bic)) {
        bad.push(
          `${o.fit.id}: k ${k}/${want.k} aic ${aic}/${want.aic} aicc ${aicc}/${want.aicc} bic ${bic}/${want.bic}`,
        );
      }
      // and R's aic where both reach the same optimum (R: fit$aic counts σ²)
      const rAic = rOptimum(o.fit).aic;
      if (sameOptimumAsR(o) && o.fit.targetBasis === 'series' && !(Math.abs(aic - rAic) <= 2 * LOGLIK_TOL)) {
        bad.push(`${o.fit.id}: aic ours ${aic}, R ${rAic}`);
      }
    }
    expect(bad).toEqual([]);
  });
});
