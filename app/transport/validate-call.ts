/**
 * Checks every call that arrives from a screen — over IPC or HTTP — before it reaches the service:
 * the method must be one of the contract's, and each argument must have the contract's shape and
 * sensible values. A bad call is refused with an ApiArgumentError naming the method, the argument
 * and the value. Plain module, no Electron: it is tested under Node and shared by both transports.
 */

import type { ForecastAdjustment, WorkspaceSettings } from '../../core/plan/types';
import type { ApiMethod, Decision, ImportRequest } from '../api/contract';

export class ApiArgumentError extends Error {
  override name = 'ApiArgumentError';
}

export const API_METHODS = [
  'storeInfo',
  'listItems',
  'reviewQueue',
  'getItem',
  'previewImport',
  'commitImport',
  'startRun',
  'runProgress',
  'cancelRun',
  'decide',
  'listOrders',
  'setOrderQty',
  'exportOrdersCsv',
  'getSettings',
  'saveSettings',
] as const satisfies readonly ApiMethod[];

/** Largest import the screens may send in one call (the text of the file). */
export const MAX_IMPORT_CHARS = 200 * 1024 * 1024;
const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function fail(method: string, what: string, value: unknown): never {
  let shown: string;
  try {
    shown = JSON.stringify(value) ?? String(value);
  } catch {
    shown = String(value);
  }
  if (shown.length > 80) shown = `${shown.slice(0, 77)}...`;
  throw new ApiArgumentError(`${method}: ${what} (got ${shown})`);
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function str(method: string, name: string, v: unknown, max = 1000): string {
  if (typeof v !== 'string') fail(method, `${name} must be a string`, v);
  if (v.length > max) fail(method, `${name} must be at most ${max} characters`, v);
  return v;
}

function num(method: string, name: string, v: unknown, min: number, max: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) fail(method, `${name} must be a finite number`, v);
  if (v < min || v > max) fail(method, `${name} must be between ${min} and ${max}`, v);
  return v;
}

function bool(method: string, name: string, v: unknown): boolean {
  if (typeof v !== 'boolean') fail(method, `${name} must be true or false`, v);
  return v;
}

function reason(method: string, v: unknown): string {
  return str(method, 'reason', v, 500).trim();
}

function sku(method: string, v: unknown): string {
  const s = str(method, 'sku', v, 200);
  if (s.trim() === '') fail(method, 'sku must not be empty', v);
  return s;
}

function isoDate(method: string, name: string, v: unknown): string {
  const s = str(method, name, v, 10);
  if (!ISO_DATE.test(s) || Number.isNaN(Date.parse(`${s}T00:00:00Z`)))
    fail(method, `${name} must be a date written YYYY-MM-DD`, v);
  return s;
}

export function validateAdjustment(method: string, v: unknown): ForecastAdjustment {
  if (!isRecord(v)) fail(method, 'adjustment must be an object', v);
  const from = isoDate(method, 'adjustment.from', v.from);
  const to = isoDate(method, 'adjustment.to', v.to);
  if (to < from) fail(method, 'adjustment.to must not be before adjustment.from', v);
  if (v.kind !== 'percent' && v.kind !== 'quantity')
    fail(method, "adjustment.kind must be 'percent' or 'quantity'", v.kind);
  const value =
    v.kind === 'percent'
      ? num(method, 'adjustment.value', v.value, -100, 1000)
      : num(method, 'adjustment.value', v.value, -1e9, 1e9);
  const why = reason(method, v.reason);
  if (why === '') fail(method, 'an adjustment needs a reason', v.reason);
  return { from, to, kind: v.kind, value, reason: why };
}

export function validateDecision(method: string, v: unknown): Decision {
  if (!isRecord(v)) fail(method, 'decision must be an object', v);
  switch (v.kind) {
    case 'accept-model':
      return { kind: 'accept-model', reason: reason(method, v.reason) };
    case 'pick-candidate':
      return {
        kind: 'pick-candidate',
        candidate: str(method, 'candidate', v.candidate, 100),
        reason: reason(method, v.reason),
      };
    case 'adjust-forecast':
      return { kind: 'adjust-forecast', adjustment: validateAdjustment(method, v.adjustment) };
    case 'remove-adjustment':
      return {
        kind: 'remove-adjustment',
        index: Math.trunc(num(method, 'index', v.index, 0, 10_000)),
        reason: reason(method, v.reason),
      };
    case 'fix-safety-stock':
      return {
        kind: 'fix-safety-stock',
        units: v.units === null ? null : num(method, 'units', v.units, 0, 1e12),
        reason: reason(method, v.reason),
      };
    case 'mark-reviewed':
      return {
        kind: 'mark-reviewed',
        reviewed: bool(method, 'reviewed', v.reviewed),
        reason: reason(method, v.reason),
      };
    default:
      return fail(method, 'decision.kind is not one the service knows', v.kind);
  }
}

export function validateImportRequest(method: string, v: unknown): ImportRequest {
  if (!isRecord(v)) fail(method, 'request must be an object', v);
  if (v.kind !== 'sales' && v.kind !== 'items' && v.kind !== 'stock')
    fail(method, "kind must be 'sales', 'items' or 'stock'", v.kind);
  const fileName = str(method, 'fileName', v.fileName, 500);
  const content = str(method, 'content', v.content, MAX_IMPORT_CHARS);
  if (!isRecord(v.mapping)) fail(method, 'mapping must be an object of column → field', v.mapping);
  const mapping: Record<string, string> = {};
  for (const [column, field] of Object.entries(v.mapping)) {
    mapping[str(method, 'mapping column', column, 200)] = str(method, `mapping[${column}]`, field, 100);
  }
  const dateOrder = v.dateOrder ?? null;
  if (dateOrder !== null && dateOrder !== 'dmy' && dateOrder !== 'mdy')
    fail(method, "dateOrder must be 'dmy', 'mdy' or null", dateOrder);
  return {
    kind: v.kind,
    fileName,
    content,
    mapping,
    dateOrder,
    force: bool(method, 'force', v.force ?? false),
  };
}

export function validateSettings(method: string, v: unknown): WorkspaceSettings {
  if (!isRecord(v)) fail(method, 'settings must be an object', v);
  if (v.serviceKind !== 'cycle' && v.serviceKind !== 'fill')
    fail(method, "serviceKind must be 'cycle' or 'fill'", v.serviceKind);
  const cut = v.abcCutoffs;
  if (!Array.isArray(cut) || cut.length !== 2) fail(method, 'abcCutoffs must be two fractions', cut);
  const a = num(method, 'abcCutoffs[0]', cut[0], 0.01, 0.99);
  const b = num(method, 'abcCutoffs[1]', cut[1], 0.01, 0.999);
  if (b <= a) fail(method, 'abcCutoffs[1] must be above abcCutoffs[0]', cut);
  const lv = v.abcServiceLevels;
  if (!isRecord(lv)) fail(method, 'abcServiceLevels must be an object with A, B and C', lv);
  return {
    serviceLevel: num(method, 'serviceLevel', v.serviceLevel, 0.5, 0.9999),
    serviceKind: v.serviceKind,
    reviewPeriodWeeks: Math.trunc(num(method, 'reviewPeriodWeeks', v.reviewPeriodWeeks, 0, 52)),
    leadTimeWeeks: num(method, 'leadTimeWeeks', v.leadTimeWeeks, 0, 104),
    horizonWeeks: Math.trunc(num(method, 'horizonWeeks', v.horizonWeeks, 1, 156)),
    weekStartDay: Math.trunc(num(method, 'weekStartDay', v.weekStartDay, 1, 7)),
    abcCutoffs: [a, b],
    abcServiceLevels: {
      A: num(method, 'abcServiceLevels.A', lv.A, 0.5, 0.9999),
      B: num(method, 'abcServiceLevels.B', lv.B, 0.5, 0.9999),
      C: num(method, 'abcServiceLevels.C', lv.C, 0.5, 0.9999),
    },
  };
}

function arity(method: string, args: unknown[], n: number): void {
  if (args.length !== n) fail(method, `takes ${n} argument${n === 1 ? '' : 's'}`, args.length);
}

/** Validates one call; returns the method and its cleaned arguments, or throws ApiArgumentError. */
export function validateCall(method: unknown, args: unknown): { method: ApiMethod; args: unknown[] } {
  if (typeof method !== 'string' || !(API_METHODS as readonly string[]).includes(method))
    fail('call', 'unknown method', method);
  if (!Array.isArray(args)) fail(method, 'arguments must be a list', args);
  const m = method as ApiMethod;
  switch (m) {
    case 'storeInfo':
    case 'listItems':
    case 'reviewQueue':
    case 'runProgress':
    case 'cancelRun':
    case 'listOrders':
    case 'exportOrdersCsv':
    case 'getSettings':
      arity(m, args, 0);
      return { method: m, args: [] };
    case 'getItem':
      arity(m, args, 1);
      return { method: m, args: [sku(m, args[0])] };
    case 'previewImport':
    case 'commitImport':
      arity(m, args, 1);
      return { method: m, args: [validateImportRequest(m, args[0])] };
    case 'startRun': {
      arity(m, args, 1);
      const o = args[0];
      if (!isRecord(o)) fail(m, 'options must be an object', o);
      return { method: m, args: [{ force: bool(m, 'force', o.force ?? false) }] };
    }
    case 'decide':
      arity(m, args, 2);
      return { method: m, args: [sku(m, args[0]), validateDecision(m, args[1])] };
    case 'setOrderQty': {
      arity(m, args, 3);
      const qty = num(m, 'qty', args[1], 0, 1e12);
      const why = reason(m, args[2]);
      if (why === '') fail(m, 'an edited quantity needs a reason', args[2]);
      return { method: m, args: [sku(m, args[0]), qty, why] };
    }
    case 'saveSettings':
      arity(m, args, 1);
      return { method: m, args: [validateSettings(m, args[0])] };
  }
}
