// biome-ignore-all lint/a11y/useSemanticElements: a virtualized list cannot be a <table> (rows are positioned one by one); the ARIA grid roles give it the same semantics
// biome-ignore-all lint/a11y/useFocusableInteractive: the grid itself takes focus and moves the active row with aria-activedescendant (WAI-ARIA grid pattern), so rows and cells are not tab stops
// biome-ignore-all lint/a11y/useKeyWithClickEvents: the keyboard path is the grid's own key handler (arrows, Enter), which opens the active row
/**
 * The items overview as an accessible, virtualized grid: only the rows in view are in the page, so
 * ten thousand items render as fast as fifty. Keyboard: arrows, Page Up/Down, Home/End move the
 * active row, Enter opens it; the grid announces the active row through aria-activedescendant.
 */
import { useVirtualizer } from '@tanstack/react-virtual';
import { type KeyboardEvent, useEffect, useRef, useState } from 'react';
import type { ItemRow } from '../../../app/api/contract';
import { units } from '../format';

const ROW_HEIGHT = 30;
/** The sticky header row's height: the rows start below it inside the same scroller. */
const HEAD_HEIGHT = 28;

const SEVERITY_WORDS: Record<string, string> = {
  critical: 'needs attention',
  warning: 'check',
  info: 'note',
};

function rowId(index: number): string {
  return `item-row-${index}`;
}

export function ItemGrid(props: {
  rows: ItemRow[];
  selected: string | null;
  onOpen: (sku: string) => void;
  /** The keyboard moved to this row: a chance to fetch it before Enter. */
  onActive?: (sku: string) => void;
  label: string;
}) {
  const { rows, selected, onOpen } = props;
  const scroller = useRef<HTMLDivElement>(null);
  const selectedIndex = selected ? rows.findIndex((r) => r.sku === selected) : -1;
  const [active, setActive] = useState(Math.max(0, selectedIndex));
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scroller.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 12,
    scrollMargin: HEAD_HEIGHT,
  });

  useEffect(() => {
    if (selectedIndex >= 0) setActive(selectedIndex);
  }, [selectedIndex]);

  const move = (to: number) => {
    const next = Math.min(rows.length - 1, Math.max(0, to));
    setActive(next);
    if (rows[next]) props.onActive?.(rows[next].sku);
    virtualizer.scrollToIndex(next, { align: 'auto' });
  };

  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const page = Math.max(1, Math.floor((scroller.current?.clientHeight ?? 300) / ROW_HEIGHT) - 1);
    let to: number | null = null;
    switch (e.key) {
      case 'ArrowDown':
        to = active + 1;
        break;
      case 'ArrowUp':
        to = active - 1;
        break;
      case 'PageDown':
        to = active + page;
        break;
      case 'PageUp':
        to = active - page;
        break;
      case 'Home':
        to = 0;
        break;
      case 'End':
        to = rows.length - 1;
        break;
      case 'Enter':
      case ' ':
        e.preventDefault();
        if (rows[active]) onOpen(rows[active].sku);
        return;
      default:
        return;
    }
    e.preventDefault();
    move(to);
  };

  const items = virtualizer.getVirtualItems();
  const activeRendered = items.some((v) => v.index === active);

  return (
    <div className="grid">
      <div
        className="grid-body"
        ref={scroller}
        data-testid="item-grid-body"
        role="grid"
        aria-label={props.label}
        aria-rowcount={rows.length + 1}
        aria-colcount={7}
        tabIndex={0}
        onKeyDown={onKey}
        aria-activedescendant={rows.length > 0 && activeRendered ? rowId(active) : undefined}
      >
        <div className="grid-head" role="rowgroup">
          <div className="grid-row grid-cols" role="row" aria-rowindex={1}>
            <span role="columnheader">SKU</span>
            <span role="columnheader">Description</span>
            <span role="columnheader">Supplier</span>
            <span role="columnheader" className="num">
              Weeks
            </span>
            <span role="columnheader">Model</span>
            <span role="columnheader">Flags</span>
            <span role="columnheader" className="num">
              Order
            </span>
          </div>
        </div>
        <div role="rowgroup" className="grid-canvas" style={{ height: virtualizer.getTotalSize() }}>
          {items.map((v) => {
            const r = rows[v.index];
            const isSelected = r.sku === selected;
            return (
              <div
                key={r.sku}
                id={rowId(v.index)}
                role="row"
                aria-rowindex={v.index + 2}
                aria-selected={isSelected}
                className={`grid-row grid-cols${isSelected ? ' selected' : ''}${v.index === active ? ' active' : ''}${r.active ? '' : ' inactive'}`}
                style={{ transform: `translateY(${v.start - HEAD_HEIGHT}px)`, height: ROW_HEIGHT }}
                onClick={() => {
                  setActive(v.index);
                  onOpen(r.sku);
                }}
                data-sku={r.sku}
              >
                <span role="gridcell" className="mono">
                  {r.sku}
                </span>
                <span role="gridcell" className="clip">
                  {r.description}
                  {!r.active && <em className="muted"> (inactive)</em>}
                </span>
                <span role="gridcell" className="clip">
                  {r.supplier ?? '–'}
                </span>
                <span role="gridcell" className="num">
                  {r.weeks}
                </span>
                <span role="gridcell" className="mono clip">
                  {r.model ?? '–'}
                </span>
                <span role="gridcell" className="clip">
                  {r.flagCount > 0 && r.worstSeverity ? (
                    <span className={`sev sev-${r.worstSeverity}`}>
                      {r.flagCount} · {SEVERITY_WORDS[r.worstSeverity]}
                    </span>
                  ) : r.model ? (
                    <span className="muted">none</span>
                  ) : (
                    ''
                  )}
                  {r.reviewed && (
                    <span className="tick">
                      {' '}
                      ✓<span className="visually-hidden"> reviewed</span>
                    </span>
                  )}
                </span>
                <span role="gridcell" className="num">
                  {units(r.orderQty)}
                </span>
              </div>
            );
          })}
        </div>
      </div>
    </div>
  );
}
