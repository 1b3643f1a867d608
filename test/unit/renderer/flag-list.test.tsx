// @vitest-environment jsdom
/** The flag list: worst first, plain words, the diagnostic behind each flag. */
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import type { Flag } from '../../../app/api/contract';
import { FlagList, sortFlags } from '../../../renderer/src/components/FlagList';

afterEach(cleanup);

const flags: Flag[] = [
  {
    code: 'short-history',
    severity: 'info',
    reason: 'Only 20 weeks of history.',
    action: 'Check the forecast.',
  },
  {
    code: 'residual-autocorrelation',
    severity: 'warning',
    reason: 'Errors still follow a pattern.',
    action: 'Try another candidate.',
  },
  {
    code: 'too-short',
    severity: 'critical',
    reason: 'Too few weeks to fit a model.',
    action: 'Set a forecast by hand.',
  },
  {
    code: 'level-shift',
    severity: 'warning',
    reason: 'The level moved mid-way.',
    action: 'Check the history.',
  },
];

describe('FlagList', () => {
  it('orders flags critical, then warning, then info, keeping the order within a severity', () => {
    expect(sortFlags(flags).map((f) => f.code)).toEqual([
      'too-short',
      'residual-autocorrelation',
      'level-shift',
      'short-history',
    ]);
  });

  it('shows each flag in plain words with what to do, and the diagnostic behind it', () => {
    render(
      <FlagList
        flags={flags}
        diagnostics={[
          {
            name: 'Ljung–Box Q(10)',
            value: 24.31,
            pValue: 0.0068,
            flagCode: 'residual-autocorrelation',
            text: '',
          },
        ]}
      />,
    );
    const items = screen.getAllByRole('listitem');
    expect(items).toHaveLength(4);
    expect(items[0].textContent).toContain('Needs attention');
    expect(items[0].textContent).toContain('Too few weeks to fit a model.');
    expect(items[0].textContent).toContain('What to do: Set a forecast by hand.');
    expect(items[1].textContent).toContain('Ljung–Box Q(10) = 24.31, p = 0.01');
    expect(items[3].textContent).toContain('Note');
  });

  it('says so when there is nothing to review', () => {
    render(<FlagList flags={[]} />);
    expect(screen.getByText(/No flags/)).toBeTruthy();
  });
});
