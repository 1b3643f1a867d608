/**
 * The service behind the screens, over the real store, import and planning run, reached through
 * the preview's HTTP transport (so this also runs where no chromium is installed): import with a
 * preview that writes nothing, a run, decisions in the audit log that survive reopening the store
 * and are respected by the next run, order edits and the CSV export.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAppService } from '../../../app/api/app-service';
import type { ItemDetail, ProvisionApi, RunProgress } from '../../../app/api/contract';
import type { ProvisionService } from '../../../app/api/service';
import { type HttpTransport, startHttpTransport } from '../../../app/transport/http';
import { httpApi } from '../../../renderer/src/api-client';

const dir = mkdtempSync(join(tmpdir(), 'provision-service-'));
const storePath = join(dir, 'svc.sqlite');
const SKUS = ['TST-001', 'TST-002', 'TST-003'];

/** 80 weeks from 2025-01-06 of a deterministic AR(1)-like series per SKU (no randomness needed). */
function salesCsv(): string {
  const lines = ['week,sku,qty'];
  SKUS.forEach((sku, k) => {
    let level = 50 + 20 * k;
    for (let w = 0; w < 80; w++) {
      const d = new Date(Date.UTC(2025, 0, 6 + 7 * w)).toISOString().slice(0, 10);
      level = 0.6 * level + 0.4 * (50 + 20 * k) + (((w * 37 + k * 11) % 17) - 8);
      lines.push(`${d},${sku},${Math.max(0, Math.round(level))}`);
    }
  });
  return `${lines.join('\n')}\n`;
}

let service: ProvisionService;
let http: HttpTransport;
let api: ProvisionApi;

async function open(): Promise<void> {
  service = createAppService(storePath, 'tester');
  http = await startHttpTransport({ service, staticDir: dir });
  api = httpApi(http.token, http.url.replace(/\/$/, ''));
}

async function close(): Promise<void> {
  await http.close();
  await service.close();
}

async function runToEnd(): Promise<RunProgress> {
  let p = await api.startRun({ force: false });
  const t0 = Date.now();
  while (p.state === 'running') {
    if (Date.now() - t0 > 90_000) throw new Error('run did not finish in 90 s');
    await new Promise((r) => setTimeout(r, 200));
    p = await api.runProgress();
  }
  return p;
}

beforeAll(open);
afterAll(close);

describe('the service over store, import and run', () => {
  const request = (content: string, mapping: Record<string, string> = {}) => ({
    kind: 'sales' as const,
    fileName: 'weekly.csv',
    content,
    mapping,
    dateOrder: null,
    force: false,
  });

  it('previews an import without writing, refuses a wrong one whole, then imports', async () => {
    const preview = await api.previewImport(request(salesCsv()));
    expect(preview.mapping).toEqual({ week: 'week', sku: 'sku', qty: 'qty' });
    expect(preview.rowsRead).toBe(240);
    expect(preview.rowLines.slice(0, 3)).toEqual([2, 3, 4]);
    expect((await api.listItems()).length).toBe(0);
    const bad = await api.commitImport(request('week,sku,qty\n2026-01-05,TST-001,many\n'));
    expect(bad.status).toBe('rejected');
    expect(bad.errors[0]).toMatchObject({ line: 2, column: 'qty', value: 'many' });
    expect((await api.listItems()).length).toBe(0);
    const ok = await api.commitImport(request(salesCsv()));
    expect(ok).toMatchObject({ status: 'imported', rowsRead: 240, items: 3 });
    expect((await api.listItems()).map((r) => r.sku)).toEqual(SKUS);
    expect((await api.commitImport(request(salesCsv()))).status).toBe('skipped');
  });

  it('runs the plan and shows each item’s model, forecast with bands, checks and order line', async () => {
    const p = await runToEnd();
    expect(p.state).toBe('done');
    expect(p.total).toBe(3);
    const d = await api.getItem('TST-001');
    const r = d.result;
    expect(r).not.toBeNull();
    if (!r) return;
    expect(r.forecast.length).toBeGreaterThan(0);
    for (const f of r.forecast) {
      expect(f.lower95).toBeLessThanOrEqual(f.lower80);
      expect(f.lower80).toBeLessThanOrEqual(f.mean);
      expect(f.upper80).toBeLessThanOrEqual(f.upper95);
    }
    expect(r.fitted.length).toBe(d.history.weekStart.length);
    expect(r.residualAcf.length).toBeGreaterThan(0);
    // the band is ±1.96/√n (Box & Jenkins), n the residual count
    expect(r.acfBand).toBeCloseTo(1.96 / Math.sqrt(r.residualCount), 2);
    expect(r.candidates.filter((c) => c.chosen)).toHaveLength(1);
    expect(r.order?.explanation.length).toBeGreaterThan(0);
    const rows = await api.listItems();
    expect(rows.every((row) => row.model !== null)).toBe(true);
  }, 120_000);

  it('records decisions with their reasons, keeps them across a reopen, and the next run respects them', async () => {
    const before = (await api.getItem('TST-002')) as ItemDetail;
    const week0 = before.result?.forecast[0].week as string;
    const week3 = before.result?.forecast[3].week as string;
    await api.decide('TST-002', {
      kind: 'adjust-forecast',
      adjustment: { from: week0, to: week3, kind: 'percent', value: 25, reason: 'trade fair' },
    });
    await api.decide('TST-002', { kind: 'fix-safety-stock', units: 40, reason: 'known margin' });
    await api.decide('TST-002', { kind: 'mark-reviewed', reviewed: true, reason: 'looked fine' });
    await expect(
      api.decide('TST-002', { kind: 'pick-candidate', candidate: 'ARMA(9,9)', reason: 'x' }),
    ).rejects.toThrow("no candidate model 'ARMA(9,9)'");
    await close();
    await open();
    const after = await api.getItem('TST-002');
    expect(after.overrides.adjustments).toEqual([
      { from: week0, to: week3, kind: 'percent', value: 25, reason: 'trade fair' },
    ]);
    expect(after.overrides.safetyStock).toBe(40);
    expect(after.reviewed).toBe(true);
    expect(after.audit.map((a) => [a.action, a.reason])).toEqual([
      ['Marked reviewed', 'looked fine'],
      ['Safety stock fixed by hand', 'known margin'],
      ['Forecast adjusted', 'trade fair'],
    ]);
    expect((await runToEnd()).state).toBe('done');
    const next = await api.getItem('TST-002');
    expect(next.result?.order?.safetyStock).toBe(40);
    expect(next.result?.overridesApplied.join(' ')).toContain('forecast adjustment');
    // +25% on the adjusted weeks: the engine says what it applied; the first week is the base × 1.25
    const baseBefore = before.result?.forecast[0].mean as number;
    expect(next.result?.forecast[0].mean).toBeCloseTo(baseBefore * 1.25, 6);
  }, 150_000);

  it('edits an order quantity (logged) and exports the order list as CSV', async () => {
    await api.setOrderQty('TST-003', 123, 'promotion stock');
    const groups = await api.listOrders();
    const line = groups.flatMap((g) => g.lines).find((l) => l.sku === 'TST-003');
    expect(line).toMatchObject({ orderQty: 123, edit: { qty: 123, reason: 'promotion stock' } });
    const { fileName, csv } = await api.exportOrdersCsv();
    expect(fileName).toMatch(/^orders-run-\d+\.csv$/);
    const rows = parse(csv, { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.sku).sort()).toEqual(SKUS);
    expect(rows.find((r) => r.sku === 'TST-003')?.order_qty).toBe('123');
    const audit = (await api.getItem('TST-003')).audit[0];
    expect(audit).toMatchObject({ action: 'Order quantity changed', reason: 'promotion stock' });
    await expect(api.setOrderQty('TST-003', 5, '')).rejects.toThrow('an edited quantity needs a reason');
  });

  it('saves workspace settings with an audit entry', async () => {
    const s = await api.getSettings();
    const saved = await api.saveSettings({ ...s, horizonWeeks: 13, serviceKind: 'fill' });
    expect(saved.horizonWeeks).toBe(13);
    expect((await api.getSettings()).serviceKind).toBe('fill');
  });
});
