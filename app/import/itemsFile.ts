/**
 * Reading an item master: one row per SKU; only the columns present are written, an empty cell
 * returns that setting to the workspace default. Service level is a fraction (0.95) or a
 * percentage written with '%' (95%); service kind is cycle (cycle service level) or fill (fill rate).
 */
import type { ServiceKind } from '../../core/plan/types';
import type { ItemPatch } from '../store/items';
import { type RowContext, uniqueSku } from './context';
import { parseFlag, parseNumber } from './numbers';

const KIND_WORDS: Record<string, ServiceKind> = {
  cycle: 'cycle',
  csl: 'cycle',
  cycle_service: 'cycle',
  cycle_service_level: 'cycle',
  alpha: 'cycle',
  fill: 'fill',
  fill_rate: 'fill',
  fillrate: 'fill',
  beta: 'fill',
};

type NumericKey =
  | 'casePack'
  | 'moq'
  | 'leadTimeWeeks'
  | 'leadTimeSdWeeks'
  | 'reviewPeriodWeeks'
  | 'unitCost'
  | 'orderCost'
  | 'shelfLifeWeeks';

const NUMERIC: { field: string; key: NumericKey; min: number; strict: boolean; what: string }[] = [
  { field: 'case_pack', key: 'casePack', min: 0, strict: true, what: 'a case pack must be above 0' },
  { field: 'moq', key: 'moq', min: 0, strict: false, what: 'a minimum order quantity cannot be negative' },
  {
    field: 'lead_time_weeks',
    key: 'leadTimeWeeks',
    min: 0,
    strict: false,
    what: 'a lead time cannot be negative',
  },
  {
    field: 'lead_time_sd_weeks',
    key: 'leadTimeSdWeeks',
    min: 0,
    strict: false,
    what: 'a standard deviation cannot be negative',
  },
  {
    field: 'review_period_weeks',
    key: 'reviewPeriodWeeks',
    min: 0,
    strict: false,
    what: 'a review period cannot be negative (0 = continuous review)',
  },
  { field: 'unit_cost', key: 'unitCost', min: 0, strict: false, what: 'a unit cost cannot be negative' },
  {
    field: 'order_cost',
    key: 'orderCost',
    min: 0,
    strict: false,
    what: 'an ordering cost cannot be negative',
  },
  {
    field: 'shelf_life_weeks',
    key: 'shelfLifeWeeks',
    min: 0,
    strict: true,
    what: 'a shelf life must be above 0 weeks',
  },
];

export class ItemsCollector {
  readonly patches: ItemPatch[] = [];
  private readonly lineOf = new Map<string, number>();

  constructor(private readonly ctx: RowContext) {}

  /** A fraction, or a percentage written with '%'. */
  private fraction(cells: string[], field: string, line: number, upper: number): number | null | undefined {
    const ctx = this.ctx;
    const text = ctx.cell(cells, field);
    if (text === '') return null;
    const pct = text.endsWith('%');
    const parsed = parseNumber(pct ? text.slice(0, -1).trim() : text, ctx.decimal);
    if (typeof parsed === 'string') {
      ctx.report.error(line, ctx.header(field), text, parsed);
      return undefined;
    }
    const value = pct ? parsed / 100 : parsed;
    if (!pct && value >= 1 && value <= 100 && field === 'service_level') {
      ctx.report.error(
        line,
        ctx.header(field),
        text,
        'is not a fraction; write a service level as 0.95 or 95%',
      );
      return undefined;
    }
    if (!(value > 0 && value < upper) && !(field === 'holding_rate' && value === 0)) {
      ctx.report.error(
        line,
        ctx.header(field),
        text,
        field === 'service_level'
          ? 'must lie between 0 and 1 (e.g. 0.95 or 95%)'
          : 'must be a fraction such as 0.25 or 25%',
      );
      return undefined;
    }
    return value;
  }

  row(cells: string[], line: number): void {
    const ctx = this.ctx;
    const r = ctx.report;
    const sku = uniqueSku(ctx, this.lineOf, cells, line, 'an item master');
    if (sku === null) return;
    const patch: ItemPatch = { sku };
    let bad = false;
    for (const f of ['description', 'supplier', 'unit'] as const) {
      if (!ctx.has(f)) continue;
      const text = ctx.cell(cells, f);
      if (f === 'description') patch.description = text;
      else patch[f] = text === '' ? null : text;
    }
    for (const spec of NUMERIC) {
      if (!ctx.has(spec.field)) continue;
      const v = ctx.number(cells, spec.field, line);
      if (v === undefined) {
        bad = true;
        continue;
      }
      if (v !== null && (spec.strict ? v <= spec.min : v < spec.min)) {
        r.error(line, ctx.header(spec.field), ctx.cell(cells, spec.field), `is out of range: ${spec.what}`);
        bad = true;
        continue;
      }
      patch[spec.key] = v;
    }
    if (ctx.has('service_level')) {
      const v = this.fraction(cells, 'service_level', line, 1);
      if (v === undefined) bad = true;
      else patch.serviceLevel = v;
    }
    if (ctx.has('holding_rate')) {
      const v = this.fraction(cells, 'holding_rate', line, 10);
      if (v === undefined) bad = true;
      else patch.holdingRate = v;
    }
    if (ctx.has('service_kind')) {
      const text = ctx.cell(cells, 'service_kind');
      const k =
        text === ''
          ? null
          : KIND_WORDS[
              text
                .toLowerCase()
                .replace(/[^a-z]+/g, '_')
                .replace(/^_|_$/g, '')
            ];
      if (k === undefined) {
        r.error(line, ctx.header('service_kind'), text, 'is not a service kind (cycle or fill)');
        bad = true;
      } else patch.serviceKind = k;
    }
    if (ctx.has('active')) {
      const text = ctx.cell(cells, 'active');
      const f = text === '' ? true : parseFlag(text);
      if (f === null) {
        r.error(line, ctx.header('active'), text, 'is not an active mark (use 1/0, yes/no or true/false)');
        bad = true;
      } else patch.active = f;
    }
    if (!bad) this.patches.push(patch);
  }
}
