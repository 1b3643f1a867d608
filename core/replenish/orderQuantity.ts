/**
 * The suggested order for one item at one review, from the policy levels and the inventory position:
 *   1. nothing when the inventory position is above the reorder point;
 *   2. otherwise order-up-to level − inventory position; or, for a lot-size policy (weekly-checked
 *      (s, Q), i.e. (R, s, nQ) with R = 1, Silver, Pyke & Thomas), the fewest whole lots Q that bring
 *      the position back above the reorder point: n = ⌊(s − position)/Q⌋ + 1,
 *   3. rounded UP to whole case packs,
 *   4. raised to the minimum order quantity (itself rounded up to whole case packs),
 *   5. capped, when the item has a shelf life, at what the forecast says will be used before the
 *      delivery expires: the forecast for the weeks from arrival (step L + 1) to arrival + shelf life,
 *      less the stock expected to be left when it arrives (position − forecast over the lead time),
 *      because older stock is sold first; the cap is rounded DOWN to whole case packs. When that cap
 *      is below the minimum order, no order is suggested and the line says why (waste is certain,
 *      the planner decides).
 * The inventory position is on hand + on order − backorders (textbook definition).
 */
export interface ShelfLifeInput {
  shelfLifeWeeks: number;
  leadTimeWeeks: number;
  /** Weekly forecast means from step 1; weeks past its end repeat its last value. */
  forecastMeans: ArrayLike<number>;
}

export interface OrderQuantityInput {
  orderUpTo: number;
  reorderPoint: number;
  /** Lot Q of a lot-size policy: order whole lots instead of up to orderUpTo. */
  lot?: number | null;
  inventoryPosition: number;
  casePack: number;
  moq: number;
  shelfLife: ShelfLifeInput | null;
}

export type OrderCap = 'above-reorder-point' | 'case-pack' | 'moq' | 'shelf-life' | 'shelf-life-below-moq';

export interface OrderQuantity {
  qty: number;
  casePacks: number;
  /** Order-up-to level − position before any rounding (0 when no order is due). */
  raw: number;
  /** Units the forecast says a delivery now can sell before expiry; null without a shelf life. */
  shelfLifeLimit: number | null;
  /** Each rounding or cap that changed the quantity, in order. */
  applied: OrderCap[];
  /** One plain sentence per step, with its arithmetic. */
  steps: string[];
}

export function orderQuantity(input: OrderQuantityInput): OrderQuantity {
  const pack = input.casePack >= 1 && Number.isFinite(input.casePack) ? input.casePack : 1;
  const moq = Math.max(0, Number.isFinite(input.moq) ? input.moq : 0);
  const ip = input.inventoryPosition;
  const applied: OrderCap[] = [];
  const steps: string[] = [];
  if (ip > input.reorderPoint) {
    steps.push(
      `The inventory position ${n(ip)} is above the reorder point ${n(input.reorderPoint)}, so nothing is ordered now.`,
    );
    applied.push('above-reorder-point');
    return { qty: 0, casePacks: 0, raw: 0, shelfLifeLimit: null, applied, steps };
  }
  const lot = input.lot != null && input.lot > 0 && Number.isFinite(input.lot) ? input.lot : null;
  let raw: number;
  if (lot != null) {
    const lots = Math.floor((input.reorderPoint - ip) / lot) + 1;
    raw = lots * lot;
    steps.push(
      `The position ${n(ip)} is at or below the reorder point ${n(input.reorderPoint)}: ${lots} lot${lots === 1 ? '' : 's'} ` +
        `of ${n(lot)} = ${n(raw)} bring${lots === 1 ? 's' : ''} it back above (to ${n(ip + raw)}).`,
    );
  } else {
    raw = Math.max(0, input.orderUpTo - ip);
    steps.push(
      `The position ${n(ip)} is at or below the reorder point ${n(input.reorderPoint)}: order-up-to level ` +
        `${n(input.orderUpTo)} − position ${n(ip)} = ${n(raw)}.`,
    );
  }
  const rounded = packRound(raw, pack, moq);
  const upPacks = ceilPacks(raw, pack);
  if (rounded.qty > 0 && upPacks * pack !== raw) {
    applied.push('case-pack');
    steps.push(
      pack === 1
        ? `Rounded up to whole units: ${n(upPacks)}.`
        : `Rounded up to whole case packs of ${n(pack)}: ${upPacks} × ${n(pack)} = ${n(upPacks * pack)}.`,
    );
  }
  if (rounded.packs > upPacks) {
    steps.push(
      `Raised to the minimum order ${n(moq)}` +
        (rounded.qty !== moq ? ` (in whole packs: ${rounded.packs} × ${n(pack)} = ${n(rounded.qty)})` : '') +
        '.',
    );
    applied.push('moq');
  }
  let packs = rounded.packs;
  let qty = rounded.qty;
  let shelfLifeLimit: number | null = null;
  if (input.shelfLife && input.shelfLife.shelfLifeWeeks > 0 && qty > 0) {
    const { shelfLifeWeeks, forecastMeans } = input.shelfLife;
    const lead = Math.max(0, Math.round(input.shelfLife.leadTimeWeeks));
    const life = Math.max(1, Math.floor(shelfLifeWeeks));
    const f = (h: number): number => {
      const m = forecastMeans.length === 0 ? 0 : forecastMeans[Math.min(h, forecastMeans.length) - 1];
      return Math.max(0, m);
    };
    let duringLead = 0;
    for (let h = 1; h <= lead; h++) duringLead += f(h);
    let duringLife = 0;
    for (let h = lead + 1; h <= lead + life; h++) duringLife += f(h);
    const leftover = Math.max(0, ip - duringLead);
    shelfLifeLimit = Math.max(0, duringLife - leftover);
    if (qty > shelfLifeLimit) {
      const capPacks = Math.floor(shelfLifeLimit / pack + 1e-9);
      const cap = capPacks * pack;
      const why =
        `Shelf life ${n(life)} weeks: a delivery in ${n(lead)} weeks can sell the forecast of weeks ` +
        `${lead + 1}–${lead + life}, ${n(duringLife)}, less the ${n(leftover)} expected to be left then ` +
        `(position ${n(ip)} − ${n(duringLead)} forecast over the lead time) = ${n(shelfLifeLimit)}`;
      if (cap === 0 || cap < moq) {
        steps.push(
          cap === 0
            ? `${why}, less than one case pack of ${n(pack)}, so no order is suggested: it would expire unsold. Review by hand.`
            : `${why}; in whole packs ${n(cap)}, below the minimum order ${n(moq)}, so no order is suggested: ` +
                'the minimum would expire unsold. Review by hand.',
        );
        applied.push('shelf-life-below-moq');
        packs = 0;
        qty = 0;
      } else {
        steps.push(`${why}; capped at ${capPacks} × ${n(pack)} = ${n(cap)}.`);
        applied.push('shelf-life');
        packs = capPacks;
        qty = cap;
      }
    }
  }
  return { qty, casePacks: packs, raw, shelfLifeLimit, applied, steps };
}

function n(x: number): string {
  if (Number.isInteger(x)) return String(x);
  return Math.abs(x) >= 100 ? x.toFixed(0) : x.toFixed(1);
}

/**
 * Steps 3 and 4 alone, for the policy simulation's inner loop: a positive quantity rounded up to
 * whole case packs, then raised to the minimum order in whole packs; zero (or below 0.001) stays zero.
 */
export function packRound(raw: number, casePack: number, moq: number): { qty: number; packs: number } {
  // Under a thousandth of a unit is floating-point noise from the levels, not a need to order.
  if (!(raw > 1e-3)) return { qty: 0, packs: 0 };
  let packs = ceilPacks(raw, casePack);
  if (packs * casePack < moq) packs = ceilPacks(moq, casePack);
  return { qty: packs * casePack, packs };
}

/** Whole packs covering x; the tolerance keeps 24.000000001 from becoming an extra pack. */
function ceilPacks(x: number, pack: number): number {
  return Math.ceil(x / pack - 1e-9);
}
