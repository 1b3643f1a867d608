/**
 * The argument checks both transports run before the service sees a call (IPC from the Electron
 * renderer, HTTP from the preview): shape, range and method name.
 */
import { describe, expect, it } from 'vitest';
import { API_METHODS, ApiArgumentError, validateCall } from '../../../app/transport/validate-call';
import { DEFAULT_WORKSPACE } from '../../../core/plan/types';

const adj = { from: '2026-01-05', to: '2026-02-02', kind: 'percent', value: 15, reason: 'promotion' };

describe('validateCall', () => {
  it('knows exactly the contract methods', () => {
    expect(API_METHODS).toHaveLength(15);
    expect(() => validateCall('constructor', [])).toThrow(ApiArgumentError);
    expect(() => validateCall('__proto__', [])).toThrow(/unknown method/);
    expect(() => validateCall(42, [])).toThrow(/unknown method/);
  });

  it('checks the number of arguments and that they come as a list', () => {
    expect(() => validateCall('listItems', ['x'])).toThrow('listItems: takes 0 arguments');
    expect(() => validateCall('getItem', [])).toThrow('getItem: takes 1 argument');
    expect(() => validateCall('getItem', 'FL-001')).toThrow('arguments must be a list');
    expect(validateCall('getItem', ['FL-001'])).toEqual({ method: 'getItem', args: ['FL-001'] });
  });

  it('checks decisions: kinds, dates in order, finite numbers, reasons', () => {
    expect(validateCall('decide', ['FL-001', { kind: 'adjust-forecast', adjustment: adj }]).args[1]).toEqual({
      kind: 'adjust-forecast',
      adjustment: adj,
    });
    const bad = (adjustment: object) => () =>
      validateCall('decide', ['FL-001', { kind: 'adjust-forecast', adjustment: { ...adj, ...adjustment } }]);
    expect(bad({ to: '2025-12-01' })).toThrow('adjustment.to must not be before adjustment.from');
    expect(bad({ from: '05/01/2026' })).toThrow('adjustment.from must be a date written YYYY-MM-DD');
    expect(bad({ value: Number.NaN })).toThrow('adjustment.value must be a finite number');
    expect(bad({ value: -150 })).toThrow('adjustment.value must be between -100 and 1000');
    expect(bad({ reason: '  ' })).toThrow('an adjustment needs a reason');
    expect(bad({ kind: 'double' })).toThrow("adjustment.kind must be 'percent' or 'quantity'");
    expect(() => validateCall('decide', ['FL-001', { kind: 'delete-everything' }])).toThrow(/decision.kind/);
    expect(() => validateCall('decide', ['', { kind: 'accept-model', reason: '' }])).toThrow(
      'sku must not be empty',
    );
    expect(() =>
      validateCall('decide', ['FL-001', { kind: 'fix-safety-stock', units: -1, reason: 'x' }]),
    ).toThrow('units must be between 0');
    expect(
      validateCall('decide', ['FL-001', { kind: 'fix-safety-stock', units: null, reason: 'x' }]).args[1],
    ).toEqual({
      kind: 'fix-safety-stock',
      units: null,
      reason: 'x',
    });
  });

  it('checks order edits and settings', () => {
    expect(() => validateCall('setOrderQty', ['FL-001', 10, ''])).toThrow(
      'an edited quantity needs a reason',
    );
    expect(() => validateCall('setOrderQty', ['FL-001', '10', 'r'])).toThrow('qty must be a finite number');
    expect(validateCall('saveSettings', [DEFAULT_WORKSPACE]).args[0]).toEqual(DEFAULT_WORKSPACE);
    expect(() => validateCall('saveSettings', [{ ...DEFAULT_WORKSPACE, serviceLevel: 1.2 }])).toThrow(
      'serviceLevel must be between 0.5 and 0.9999',
    );
    expect(() => validateCall('saveSettings', [{ ...DEFAULT_WORKSPACE, abcCutoffs: [0.9, 0.8] }])).toThrow(
      'abcCutoffs[1] must be above abcCutoffs[0]',
    );
    expect(() => validateCall('saveSettings', [{ ...DEFAULT_WORKSPACE, weekStartDay: 9 }])).toThrow(
      'weekStartDay',
    );
  });

  it('checks import requests', () => {
    const req = {
      kind: 'sales',
      fileName: 'w.csv',
      content: 'week,sku,qty\n',
      mapping: {},
      dateOrder: null,
      force: false,
    };
    expect(validateCall('previewImport', [req]).args[0]).toEqual(req);
    expect(() => validateCall('commitImport', [{ ...req, kind: 'orders' }])).toThrow("kind must be 'sales'");
    expect(() => validateCall('commitImport', [{ ...req, mapping: { a: 3 } }])).toThrow(
      'mapping[a] must be a string',
    );
    expect(() => validateCall('commitImport', [{ ...req, dateOrder: 'ymd' }])).toThrow('dateOrder');
  });
});
