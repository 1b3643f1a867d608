// @vitest-environment jsdom
/** The import screen's mapping preview: detected mapping shown per column, changes, problems with line numbers. */
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { ImportPreview } from '../../../app/api/contract';
import { MappingPreview } from '../../../renderer/src/components/MappingPreview';

afterEach(cleanup);

const preview = (over: Partial<ImportPreview> = {}): ImportPreview => ({
  kind: 'sales',
  header: ['Week', 'Item Code', 'Units', 'Note'],
  rows: [
    ['2026-01-05', 'FL-001', '120', ''],
    ['2026-01-12', 'FL-001', 'abc', 'typo'],
  ],
  rowLines: [2, 3],
  mapping: { Week: 'week', 'Item Code': 'sku', Units: 'qty', Note: 'ignore' },
  fields: ['week', 'date', 'sku', 'qty', 'stockout', 'order'],
  rowsRead: 2,
  problems: [
    {
      line: 3,
      column: 'Units',
      value: 'abc',
      message: "w.csv line 3, column 'Units': 'abc' is not a number",
    },
  ],
  totalProblems: 1,
  warnings: [],
  format: { delimiter: ',', decimal: '.', dateOrder: '' },
  items: 1,
  weeks: 2,
  unknownSkus: [],
  alreadyImported: null,
  ...over,
});

describe('MappingPreview', () => {
  it('shows each column with its detected field, the rows with their line numbers, and every problem', () => {
    render(<MappingPreview preview={preview()} onMappingChange={() => {}} />);
    expect((screen.getByLabelText('Field for column Item Code') as HTMLSelectElement).value).toBe('sku');
    expect((screen.getByLabelText('Field for column Note') as HTMLSelectElement).value).toBe('ignore');
    const rows = screen.getAllByRole('row');
    expect(rows).toHaveLength(3); // header + 2 data rows
    expect(rows[2].textContent).toContain('3');
    expect(rows[2].textContent).toContain('abc');
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain('1 problem');
    expect(alert.textContent).toContain('nothing will be imported');
    expect(alert.textContent).toContain("w.csv line 3, column 'Units'");
    expect(alert.textContent).toContain("'abc' is not a number");
  });

  it('gives a field to one column only: choosing it elsewhere frees the old column', () => {
    const onChange = vi.fn();
    render(<MappingPreview preview={preview()} onMappingChange={onChange} />);
    fireEvent.change(screen.getByLabelText('Field for column Note'), { target: { value: 'qty' } });
    expect(onChange).toHaveBeenCalledWith({ Week: 'week', 'Item Code': 'sku', Units: 'ignore', Note: 'qty' });
  });

  it('says when nothing is wrong and counts problems beyond the listed ones', () => {
    const { unmount } = render(
      <MappingPreview preview={preview({ problems: [], totalProblems: 0 })} onMappingChange={() => {}} />,
    );
    expect(screen.getByText('No problems found.')).toBeTruthy();
    unmount();
    render(<MappingPreview preview={preview({ totalProblems: 57 })} onMappingChange={() => {}} />);
    expect(screen.getByRole('alert').textContent).toContain('57 problems');
    expect(screen.getByText('…and 56 more.')).toBeTruthy();
  });
});
