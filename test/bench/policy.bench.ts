/**
 * Service achieved by the replenishment policy on long simulations of ARMA demand
 * (core/replenish/policySimulation), beside the √L rule on the same demand. Prints figures; the
 * pass/fail ranges are in test/unit/replenish/policySimulation.test.ts. Demand models in the
 * ma-minus convention, mean 100, σ_ε = 10; the policy uses the true model's moments.
 * Continuous review is checked at each weekly run: the weekly-check (R, s, nQ) rule with R = 1
 * ("ours"), the √L rule, and the textbook (s, Q) rule it replaced (protection over L only, order up
 * to s + Q: "old") and the whole extra week taken as forecast demand (s over L + 1 weeks, textbook k,
 * whole lots: "L + 1").
 */
import { simulatePolicy } from '../../core/replenish/policySimulation';

const years = Number(process.env.POLICY_YEARS ?? 4000);
const models = [
  { name: 'AR(1) φ=0.7', ar: [0.7], ma: [] as number[] },
  { name: 'MA(1) θ=0.5', ar: [] as number[], ma: [0.5] },
  { name: 'ARMA(1,1) φ=0.7 θ=−0.5', ar: [0.7], ma: [-0.5] },
];
const pct = (x: number) => `${(100 * x).toFixed(2)}%`;
const started = performance.now();
for (const [review, lot] of [
  [1, undefined],
  [0, 100],
  [0, 200],
  [0, 400],
  [0, 800],
] as const) {
  const continuous = review === 0;
  process.stdout.write(
    `\n${continuous ? `continuous review (s, Q) checked at each weekly run, lot ${lot} = ${(lot ?? 0) / 100} weeks of demand` : 'periodic review R = 1 (protection interval L + 1)'}; ${years} years each\n`,
  );
  process.stdout.write(
    `model                      L  | cycle 95%: ours    √L rule${continuous ? '     old   L + 1' : ''}  | fill 98%: ours    √L rule${continuous ? '     old   L + 1' : ''}  | avg on hand ours/√L (cycle)\n`,
  );
  for (const m of models) {
    for (const L of [2, 6]) {
      const base = {
        model: { ar: m.ar, ma: m.ma, sigma2: 100, mean: 100 },
        leadTimeWeeks: L,
        reviewPeriodWeeks: review,
        years,
        seed: 42 + L,
        lotSize: lot,
      };
      const c = simulatePolicy({ ...base, service: { kind: 'cycle', level: 0.95 } });
      const cs = simulatePolicy({ ...base, service: { kind: 'cycle', level: 0.95 }, rule: 'sqrt-weeks' });
      const f = simulatePolicy({ ...base, service: { kind: 'fill', level: 0.98 } });
      const fs = simulatePolicy({ ...base, service: { kind: 'fill', level: 0.98 }, rule: 'sqrt-weeks' });
      let oldC = '';
      let oldF = '';
      let plusC = '';
      let plusF = '';
      if (continuous) {
        const co = simulatePolicy({
          ...base,
          service: { kind: 'cycle', level: 0.95 },
          rule: 'lead-time-only',
        });
        const fo = simulatePolicy({
          ...base,
          service: { kind: 'fill', level: 0.98 },
          rule: 'lead-time-only',
        });
        oldC = pct(co.cycleServiceLevel).padStart(8);
        oldF = pct(fo.fillRate).padStart(8);
        const cp = simulatePolicy({
          ...base,
          service: { kind: 'cycle', level: 0.95 },
          rule: 'lead-time-plus-week',
        });
        const fp = simulatePolicy({
          ...base,
          service: { kind: 'fill', level: 0.98 },
          rule: 'lead-time-plus-week',
        });
        plusC = pct(cp.cycleServiceLevel).padStart(8);
        plusF = pct(fp.fillRate).padStart(8);
      }
      process.stdout.write(
        `${m.name.padEnd(26)} ${L}  | ${pct(c.cycleServiceLevel).padStart(15)} ${pct(cs.cycleServiceLevel).padStart(9)}${oldC}${plusC}  | ${pct(
          f.fillRate,
        ).padStart(
          14,
        )} ${pct(fs.fillRate).padStart(9)}${oldF}${plusF}  | ${c.averageOnHand.toFixed(1)} / ${cs.averageOnHand.toFixed(1)}\n`,
      );
    }
  }
}
process.stdout.write(`\nwall time ${((performance.now() - started) / 1000).toFixed(1)} s\n`);
