/** Display formatting only (no statistics): numbers, percentages and week labels as the screens show them. */
const whole = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });
const one = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1, minimumFractionDigits: 1 });
const two = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: 2 });

export function units(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '–' : whole.format(v);
}

export function dec1(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '–' : one.format(v);
}

export function dec2(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '–' : two.format(v);
}

export function percent(fraction: number | null | undefined): string {
  return fraction === null || fraction === undefined ? '–' : `${one.format(fraction * 100)}%`;
}

export function serviceLabel(level: number, kind: 'cycle' | 'fill'): string {
  return `${percent(level)} ${kind === 'cycle' ? 'cycle service' : 'fill rate'}`;
}
