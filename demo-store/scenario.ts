/**
 * The demo scenario, generated from one seed: ~150 items of the fictional wholesaler with three
 * years (156 weeks) of weekly demand ending with the last complete week before 2026-11-30, and the
 * inventory position at the end of that week. The items cover what a planner meets: steady sellers,
 * AR(1) and MA(1) demand (Box–Jenkins sign: e_t − θ e_{t−1}), holiday-baking peaks, a trend,
 * intermittent specialities, a one-off spike, a new item (20 weeks), a discontinued item, a pattern
 * break, and a few stocked-out weeks.
 */
import { formatIsoDate, isoWeekOf, parseIsoDate, weekStartOf } from '../core/series/calendar';
import { CATEGORIES, type Category, SUPPLIERS } from './catalogue';
import { DemoRandom } from './rng';

export const DEMO_SEED = 20261130;
export const DEMO_WEEKS = 156;
/** The last complete week before 2026-11-30 (a Monday) starts on 2026-11-23. */
export const DEMO_LAST_WEEK = formatIsoDate(weekStartOf(parseIsoDate('2026-11-30')!, 1) - 7);

export type DemoPattern =
  | 'steady'
  | 'ar'
  | 'ma'
  | 'seasonal'
  | 'trend'
  | 'intermittent'
  | 'spike'
  | 'new'
  | 'discontinued'
  | 'break';

export interface DemoItem {
  sku: string;
  description: string;
  category: Category;
  supplier: string;
  unit: string;
  casePack: number;
  moq: number | null;
  leadTimeWeeks: number;
  leadTimeSdWeeks: number;
  reviewPeriodWeeks: number | null;
  serviceLevel: string;
  serviceKind: string;
  unitCost: number;
  holdingRate: number;
  orderCost: number;
  shelfLifeWeeks: number | null;
  active: boolean;
  pattern: DemoPattern;
  fractional: boolean;
  /** In the sales files but not in the item master (becomes a placeholder on import). */
  missingFromMaster?: boolean;
  /** Weekly quantity per week of the scenario; null = the item did not exist / was not sold that week. */
  qty: (number | null)[];
  stockout: boolean[];
  position: { onHand: number; onOrder: number; backorders: number };
}

export interface DemoScenario {
  weeks: string[];
  items: DemoItem[];
}

const SHELF_LIFE: Record<string, number | null> = {
  'Fresh Yeast Block': 3,
  'Rye Sourdough Starter': 2,
  'Wheat Levain Culture': 2,
  'Instant Dry Yeast': 52,
  'Baking Powder': 78,
  'Bicarbonate of Soda': 104,
  'Unsalted Butter Block': 10,
  'Lactic Butter Sheets': 10,
  'Whipping Cream': 2,
  'Skimmed Milk Powder': 52,
  'Cream Cheese Tub': 6,
  'Liquid Egg Pasteurised': 3,
};

const SEASONAL_NAMES = [
  'Mincemeat',
  'Icing Sugar',
  'Caster Sugar',
  'Almond Frangipane',
  'Window Cake Boxes',
  'Paper Baking Cases',
  'Light Muscovado',
  'Unsalted Butter Block',
  'Golden Syrup',
  'Cherry Compote',
];

const SPECIALITY: Category[] = ['fillings', 'grains & seeds', 'yeasts & leavens'];

const round = (x: number, frac: boolean) => (frac ? Math.round(x * 10) / 10 : Math.round(x));

/** Holiday-baking multiplier: a bell around ISO week 50 plus a smaller one around Easter (week 13). */
function holiday(week: string, amplitude: number): number {
  const w = isoWeekOf(parseIsoDate(week)!).week;
  const xmas = Math.exp(-((w - 50) ** 2) / (2 * 2.2 ** 2));
  const easter = 0.35 * Math.exp(-((w - 13) ** 2) / (2 * 1.5 ** 2));
  return 1 + amplitude * (xmas + easter);
}

export function generateScenario(seed = DEMO_SEED): DemoScenario {
  const rng = new DemoRandom(seed);
  const last = parseIsoDate(DEMO_LAST_WEEK)!;
  const weeks = Array.from({ length: DEMO_WEEKS }, (_, i) => formatIsoDate(last - 7 * (DEMO_WEEKS - 1 - i)));
  const n = weeks.length;

  // The range: every name × pack of each category, thinned to about 150 items.
  const drafts: { spec: (typeof CATEGORIES)[number]; name: string; pack: string; seq: number }[] = [];
  for (const spec of CATEGORIES) {
    let seq = 1;
    for (const name of spec.names)
      for (const pack of spec.packs) drafts.push({ spec, name, pack, seq: seq++ });
  }
  const kept = drafts.filter((_, i) => i % 9 !== 4 || i < 9); // drops ~1 in 9 → 150 items
  const items: DemoItem[] = [];
  for (const d of kept) {
    const supplier = SUPPLIERS.find((s) => s.name === d.spec.supplier)!;
    const smallPack = d.pack !== d.spec.packs[0];
    const level =
      (d.spec.level[0] + rng.next() * (d.spec.level[1] - d.spec.level[0])) * (smallPack ? 0.55 : 1);
    const seasonal = SEASONAL_NAMES.includes(d.name);
    const r = rng.next();
    const pattern: DemoPattern = seasonal
      ? 'seasonal'
      : r < 0.2
        ? 'ar'
        : r < 0.32
          ? 'ma'
          : r < 0.45 && smallPack && SPECIALITY.includes(d.spec.category)
            ? 'intermittent' // small packs of specialities sell now and then
            : 'steady';
    const cost = d.spec.unitCost[0] + rng.next() * (d.spec.unitCost[1] - d.spec.unitCost[0]);
    items.push({
      sku: `${d.spec.prefix}-${String(100 + d.seq).padStart(3, '0')}`,
      description: `${d.name} ${d.pack}`,
      category: d.spec.category,
      supplier: supplier.name,
      unit: d.spec.unit,
      casePack: rng.pick(d.spec.casePack),
      moq: rng.next() < 0.2 ? rng.pick([5, 10, 20]) : null,
      leadTimeWeeks: supplier.leadTimeWeeks,
      leadTimeSdWeeks: supplier.leadTimeSdWeeks,
      reviewPeriodWeeks: d.spec.category === 'packaging' ? 4 : rng.next() < 0.1 ? 0 : null,
      serviceLevel: rng.next() < 0.15 ? rng.pick(['97%', '0.99', '90%']) : '',
      serviceKind: rng.next() < 0.15 ? 'fill' : '',
      unitCost: Math.round(cost * 100) / 100,
      holdingRate: 0.25,
      orderCost: rng.pick([25, 35, 50, 60]),
      shelfLifeWeeks: SHELF_LIFE[d.name] ?? d.spec.shelfLifeWeeks,
      active: true,
      pattern,
      fractional: d.spec.fractional,
      qty: new Array(n).fill(0),
      stockout: new Array(n).fill(false),
      position: { onHand: 0, onOrder: 0, backorders: 0 },
    });
    (items[items.length - 1] as DemoItem & { level: number }).level = level;
  }

  // The named cases a planner should meet once each.
  const bySku = (prefix: string, k: number) => {
    const list = items.filter((it) => it.sku.startsWith(prefix));
    return list[k % list.length];
  };
  bySku('FLR', 12).pattern = 'trend'; // rising with the taste for ancient grains
  bySku('GRS', 15).pattern = 'trend';
  bySku('SUG', 3).pattern = 'spike';
  bySku('FIL', 7).pattern = 'new';
  bySku('FAT', 4).pattern = 'discontinued';
  bySku('FAT', 4).active = false;
  bySku('DRY', 2).pattern = 'break';
  for (const k of [5, 11, 15]) bySku('FIL', k).pattern = 'intermittent';
  bySku('GRS', 11).pattern = 'intermittent';
  bySku('YST', 8).pattern = 'intermittent';

  for (const it of items) {
    const level = (it as DemoItem & { level: number }).level;
    const sd = Math.max(1, 0.18 * level);
    const phi = 0.5 + 0.3 * rng.next();
    const theta = (rng.next() < 0.5 ? -1 : 1) * (0.4 + 0.3 * rng.next());
    const amp = 0.6 + rng.next() * 1.2;
    let x = 0;
    let ePrev = 0;
    for (let t = 0; t < n; t++) {
      let v: number;
      switch (it.pattern) {
        case 'ar':
          x = phi * x + sd * rng.normal();
          v = level + x;
          break;
        case 'ma': {
          const e = sd * rng.normal();
          v = level + e - theta * ePrev;
          ePrev = e;
          break;
        }
        case 'seasonal':
          v = level * holiday(weeks[t], amp) + sd * rng.normal();
          break;
        case 'trend':
          v = level * (0.55 + (0.9 * t) / n) + sd * rng.normal();
          break;
        case 'intermittent':
          v = rng.next() < 0.18 ? 1 + rng.poisson(Math.max(1, level / 6)) : 0;
          break;
        case 'spike':
          v = (t === n - 40 ? 7 * level : level) + sd * rng.normal();
          break;
        case 'break':
          if (t < 90) v = level + 0.6 * sd * rng.normal();
          else {
            x = 0.7 * x + sd * rng.normal();
            v = 1.8 * level + x;
          }
          break;
        default:
          v = it.fractional ? level + sd * rng.normal() : rng.poisson(level);
      }
      it.qty[t] = Math.max(0, round(v, it.fractional));
    }
    if (it.pattern === 'new') for (let t = 0; t < n - 20; t++) it.qty[t] = null;
    if (it.pattern === 'discontinued') for (let t = n - 46; t < n; t++) it.qty[t] = null;
  }

  // A few stocked-out weeks: sales fell to a fraction of demand and the export marks them.
  for (const [k, at] of [
    [3, 60],
    [27, 120],
    [64, 141],
    [101, 30],
  ] as const) {
    const it = items[k];
    if (it.pattern === 'new' || it.pattern === 'discontinued') continue;
    for (let t = at; t < at + 2; t++) {
      it.qty[t] = round((it.qty[t] ?? 0) * 0.3, it.fractional);
      it.stockout[t] = true;
    }
  }

  // One SKU the item master does not list (a tasting kit sold from the counter).
  const kitLevel = 6;
  items.push({
    sku: 'SMP-900',
    description: 'Seasonal tasting kit',
    category: 'fillings',
    supplier: 'Saltmarsh Sugar & Syrup',
    unit: 'kit',
    casePack: 1,
    moq: null,
    leadTimeWeeks: 2,
    leadTimeSdWeeks: 0,
    reviewPeriodWeeks: null,
    serviceLevel: '',
    serviceKind: '',
    unitCost: 9.5,
    holdingRate: 0.25,
    orderCost: 25,
    shelfLifeWeeks: null,
    active: true,
    pattern: 'steady',
    fractional: false,
    missingFromMaster: true,
    qty: weeks.map((_, t) => (t < n - 30 ? null : rng.poisson(kitLevel))),
    stockout: new Array(n).fill(false),
    position: { onHand: 0, onOrder: 0, backorders: 0 },
  });

  // Inventory position at the end of the last week.
  for (const it of items) {
    if (it.missingFromMaster) continue;
    const recent = it.qty.slice(-8).map((q) => q ?? 0);
    const mean = recent.reduce((a, b) => a + b, 0) / recent.length;
    const cover = it.leadTimeWeeks + 1;
    it.position = {
      onHand: it.active ? round(mean * cover * (0.3 + 1.2 * rng.next()), it.fractional) : 0,
      onOrder:
        it.active && rng.next() < 0.35 ? Math.ceil((mean * it.leadTimeWeeks) / it.casePack) * it.casePack : 0,
      backorders: it.active && rng.next() < 0.04 ? Math.max(1, round(mean * 0.3, false)) : 0,
    };
  }
  return { weeks, items };
}
