/**
 * Checks what the planner typed into the forecast-adjustment form before it is sent: dates in
 * order and within the forecast, a number of the right kind, a reason. Input checking only; the
 * service checks again and applies the adjustment.
 */
import type { ForecastAdjustment } from '../../../app/api/contract';

export interface AdjustmentInput {
  from: string;
  to: string;
  kind: 'percent' | 'quantity';
  value: string;
  reason: string;
}

export type AdjustmentErrors = Partial<Record<keyof AdjustmentInput, string>>;

const ISO = /^\d{4}-\d{2}-\d{2}$/;

export function parseNumber(text: string): number | null {
  const t = text.trim().replace(/\s/g, '').replace(',', '.');
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(t)) return null;
  return Number(t);
}

export function checkAdjustment(
  input: AdjustmentInput,
  forecastWeeks: { first: string; last: string } | null,
): { adjustment: ForecastAdjustment } | { errors: AdjustmentErrors } {
  const errors: AdjustmentErrors = {};
  if (!ISO.test(input.from)) errors.from = 'Choose the first week.';
  if (!ISO.test(input.to)) errors.to = 'Choose the last week.';
  if (!errors.from && !errors.to && input.to < input.from) errors.to = 'The last week is before the first.';
  if (forecastWeeks && !errors.from && !errors.to) {
    if (input.to < forecastWeeks.first || input.from > forecastWeeks.last)
      errors.from = `The range must overlap the forecast (${forecastWeeks.first} to ${forecastWeeks.last}).`;
  }
  const value = parseNumber(input.value);
  if (value === null) errors.value = 'Enter a number.';
  else if (value === 0) errors.value = 'An adjustment of zero changes nothing.';
  else if (input.kind === 'percent' && value < -100)
    errors.value = 'A cut of more than 100% is not possible.';
  else if (input.kind === 'percent' && value > 1000)
    errors.value = 'More than +1000% is surely a typing error.';
  if (input.reason.trim().length < 3) errors.reason = 'Say why (a few words), for the audit log.';
  if (Object.keys(errors).length > 0) return { errors };
  return {
    adjustment: {
      from: input.from,
      to: input.to,
      kind: input.kind,
      value: value as number,
      reason: input.reason.trim(),
    },
  };
}
