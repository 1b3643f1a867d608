/**
 * `fit` through the real command line in a child process (issue 2, command line): JSON Lines with
 * the fields the issue lists, errors naming file, line and field, other files still reported.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readWeeklyCsv } from '../../app/cli/fit-csv';
import { simulateArma } from '../../core/arma';
import { cliCommand } from '../bench/cliCommand';

const root = join(import.meta.dirname, '..', '..');
let dir = '';

function csv(values: (number | null)[], header = 'week,qty', start = Date.UTC(2023, 0, 2)): string {
  const lines = [header];
  values.forEach((v, i) => {
    const d = new Date(start + i * 7 * 86400000).toISOString().slice(0, 10);
    lines.push(`${d},${v === null ? '' : v.toFixed(2)}`);
  });
  return `${lines.join('\n')}\n`;
}

function runFit(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const [cmd, ...cli] = cliCommand();
  const r = spawnSync(cmd, [...cli, 'fit', ...args], {
    cwd: root,
    encoding: 'utf8',
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'provision-cli-fit-'));
  const y = Array.from(simulateArma({ ar: [0.6], ma: [0.3], sigma2: 4, mean: 60 }, 104, 3));
  const gappy: (number | null)[] = [...y];
  gappy[10] = null;
  writeFileSync(join(dir, 'good.csv'), csv(y));
  writeFileSync(join(dir, 'gappy.csv'), csv(gappy));
  writeFileSync(join(dir, 'renamed.csv'), csv(y, 'date,units'));
  writeFileSync(join(dir, 'badnum.csv'), 'week,qty\n2023-01-02,5\n2023-01-09,12x\n');
  writeFileSync(join(dir, 'baddate.csv'), 'week,qty\n2023-01-02,5\n2023-13-09,12\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('npm run cli -- fit', () => {
  it('prints one JSON line per file with the fields of the issue, in order (--order 1,0,1)', () => {
    const r = runFit([join(dir, 'good.csv'), join(dir, 'gappy.csv'), '--horizon', '5', '--order', '1,0,1']);
    expect(r.status).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines.length).toBe(2);
    const rec = JSON.parse(lines[0]);
    // The issue's fields come first; later issues (model choice) may append their own after them.
    expect(Object.keys(rec).slice(0, 16)).toEqual([
      'file',
      'n',
      'order',
      'mean',
      'ar',
      'ma',
      'sigma2',
      'loglik',
      'aic',
      'aicc',
      'bic',
      'converged',
      'stderr',
      'flags',
      'forecast',
      'signConvention',
    ]);
    expect(rec.order).toEqual({ p: 1, d: 0, q: 1 });
    expect(rec.n).toBe(104);
    expect(rec.signConvention).toBe('ma-minus');
    expect(rec.forecast.length).toBe(5);
    expect(Object.keys(rec.forecast[0])).toEqual([
      'step',
      'mean',
      'se',
      'lower80',
      'upper80',
      'lower95',
      'upper95',
    ]);
    expect(rec.forecast[0].lower95).toBeLessThan(rec.forecast[0].lower80);
    expect(typeof rec.mean).toBe('number');
    // The gap is a missing week: 103 observed of 104.
    const gap = JSON.parse(lines[1]);
    expect(gap.n).toBe(104);
    expect(gap.aic).toBeCloseTo(-2 * gap.loglik + 2 * 4, 8);
  });

  it('honours --order, --no-mean and renamed columns', () => {
    const r = runFit([
      join(dir, 'renamed.csv'),
      '--order',
      '2,1,1',
      '--no-mean',
      '--date-column',
      'date',
      '--value-column',
      'units',
    ]);
    expect(r.status).toBe(0);
    const rec = JSON.parse(r.stdout);
    expect(rec.order).toEqual({ p: 2, d: 1, q: 1 });
    expect(rec.mean).toBeNull();
    expect(rec.ar.length).toBe(2);
    expect(rec.forecast.length).toBe(12);
  });

  it('names file, line and field on bad input, exits non-zero and still reports the other files', () => {
    const r = runFit([
      join(dir, 'badnum.csv'),
      join(dir, 'missing.csv'),
      join(dir, 'good.csv'),
      join(dir, 'baddate.csv'),
    ]);
    expect(r.status).toBe(1);
    expect(r.stdout.trim().split('\n').length).toBe(1);
    expect(r.stderr).toContain(`${join(dir, 'badnum.csv')}: line 3: field 'qty': '12x' is not a number`);
    expect(r.stderr).toContain(`${join(dir, 'missing.csv')}: cannot read the file`);
    expect(r.stderr).toContain(
      `${join(dir, 'baddate.csv')}: line 3: field 'week': '2023-13-09' is not a date`,
    );
  });

  it('reads quoted CSV (csv-parse) and plain CSV (fast split) to the same series, BOM and CRLF included', () => {
    writeFileSync(
      join(dir, 'quoted.csv'),
      '\ufeff"week","qty"\r\n"2024-01-01",5\r\n2024-01-08,"6"\r\n\r\n2024-01-22,7\r\n',
    );
    writeFileSync(
      join(dir, 'plain.csv'),
      '\ufeffweek,qty\r\n2024-01-01, 5\r\n2024-01-08,6\r\n\r\n2024-01-22,7\r\n',
    );
    const opts = { dateColumn: 'week', valueColumn: 'qty' };
    const quoted = Array.from(readWeeklyCsv(join(dir, 'quoted.csv'), opts).values);
    const plain = Array.from(readWeeklyCsv(join(dir, 'plain.csv'), opts).values);
    // 2024-01-15 is skipped: a missing week.
    expect(quoted).toEqual([5, 6, Number.NaN, 7]);
    expect(plain).toEqual(quoted);
  });

  it('plain-CSV scanner: quantities read as Number() reads them, fields trimmed, physical line numbers', () => {
    // Number() (ECMAScript StringToNumber) is the reference for every quantity form NUMBER accepts.
    const cells = ['1e3', '-.5', '+7.', '0.1234567890123456789', '-0', '1234567.125', '0.30000000000000004'];
    cells.push('123456789012345', '1234567890123456', '00012.5000', '5e-324', '1E+2', '99999999999999.9');
    const day0 = Date.UTC(2024, 0, 1);
    const rows = cells.map(
      (c, i) => `${new Date(day0 + 7 * i * 86400000).toISOString().slice(0, 10)},\u00a0${c} `,
    );
    writeFileSync(join(dir, 'numbers.csv'), `x,week,qty,y\n${rows.map((r) => `a,${r},b`).join('\n')}\n`);
    const v = readWeeklyCsv(join(dir, 'numbers.csv'), { dateColumn: 'week', valueColumn: 'qty' }).values;
    expect(Array.from(v).map((x) => (Object.is(x, -0) ? '-0' : x))).toEqual(
      cells.map((c) => (Object.is(Number(c), -0) ? '-0' : Number(c))),
    );
    // A blank line before the bad row: the message names the line as it is in the file.
    writeFileSync(join(dir, 'blankline.csv'), 'week,qty\n2024-01-01,5\n\n2024-01-08,.\n');
    expect(() =>
      readWeeklyCsv(join(dir, 'blankline.csv'), { dateColumn: 'week', valueColumn: 'qty' }),
    ).toThrow(`${join(dir, 'blankline.csv')}: line 4: field 'qty': '.' is not a number`);
    writeFileSync(join(dir, 'leap.csv'), 'week,qty\n2023-02-27,1\n2023-02-29,1\n');
    expect(() => readWeeklyCsv(join(dir, 'leap.csv'), { dateColumn: 'week', valueColumn: 'qty' })).toThrow(
      "line 3: field 'week': '2023-02-29' is not a date",
    );
    writeFileSync(join(dir, 'isoweek.csv'), 'week,qty\n2024-W01,1\n2024W03,2\n');
    expect(
      Array.from(readWeeklyCsv(join(dir, 'isoweek.csv'), { dateColumn: 'week', valueColumn: 'qty' }).values),
    ).toEqual([1, Number.NaN, 2]);
  });

  it('rejects a bad --order with a usage message', () => {
    const r = runFit([join(dir, 'good.csv'), '--order', '7,0,1']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--order');
  });
});
