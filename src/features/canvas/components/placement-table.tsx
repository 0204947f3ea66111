// The placements of the shown side, linked to the canvas: a click selects (and centres) the part;
// a selection made on the canvas highlights and scrolls to its row.
import { useVirtualizer } from '@tanstack/react-virtual';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { RunResult } from '../../../../shared/core';
import { useCanvasState, type CanvasStore } from '../store';
import { scrollWithin } from './scroll';
import { fixed } from '../../../lib/format';

const ROW_H = 30;
/** Up to this many rows are all in the DOM; more are virtualised. */
const VIRTUAL_ABOVE = 300;
const COLS = ['#', 'Board', 'Ref', 'Package', 'Value', 'X mm', 'Y mm', 'Rot °', 'Nozzle', 'Vision'] as const;
const WIDTHS = '3rem 3.4rem 4.5rem minmax(7.5rem, 1.2fr) minmax(6.5rem, 1fr) 5.6rem 5.6rem 4.6rem 4.2rem minmax(6.5rem, 1fr)';
const MIN_WIDTH = '56rem';

export function PlacementTable({ run, store, height = 320 }: { run: RunResult; store: CanvasStore; height?: number }) {
  const p = run.placements;
  const selected = useCanvasState(store, (s) => s.selected);
  const dimFilters = useCanvasState(store, (s) => s.filters);
  const [query, setQuery] = useState('');
  const rows = useMemo(() => {
    const q = query.trim().toLowerCase();
    const out: number[] = [];
    for (let i = 0; i < p.count; i++) {
      if (q && !`${p.ref[i]} ${p.packageName[i] ?? ''} ${p.value[i]} ${p.footprint[i]} ${p.nozzle[i] ?? ''}`.toLowerCase().includes(q)) continue;
      out.push(i);
    }
    return out;
  }, [p, query]);
  const rowOf = useMemo(() => new Map(rows.map((i, r) => [i, r])), [rows]);
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtual = rows.length > VIRTUAL_ABOVE;
  const virt = useVirtualizer({ count: virtual ? rows.length : 0, getScrollElement: () => scrollRef.current, estimateSize: () => ROW_H, overscan: 10 });
  const lastScrolled = useRef<number>(-1);
  useEffect(() => {
    if (selected.size === 0) {
      lastScrolled.current = -1;
      return;
    }
    const first = Math.min(...selected);
    const r = rowOf.get(first);
    if (r !== undefined && first !== lastScrolled.current) {
      if (virtual) virt.scrollToIndex(r, { align: 'center' });
      else scrollWithin(scrollRef.current, scrollRef.current?.querySelector(`[data-row-id="${CSS.escape(`${p.board[first]}:${p.ref[first]}`)}"]`) ?? null);
      lastScrolled.current = first;
    }
  }, [selected, rowOf, virt, virtual, p]);

  const filtered = dimFilters.packages.length || dimFilters.nozzles.length;
  const items = virtual ? virt.getVirtualItems() : rows.map((_, index) => ({ index, start: index * ROW_H }));
  const total = virtual ? virt.getTotalSize() : rows.length * ROW_H;
  return (
    <div className="flex flex-col gap-1.5">
      <div className="flex items-center gap-2">
        <input
          type="search"
          aria-label="Filter placements"
          placeholder="Filter placements…"
          value={query}
          onChange={(e) => setQuery(e.target.value)}
          className="w-56 rounded border border-ink-300 bg-white px-2 py-1 text-sm"
        />
        <span className="num text-xs text-ink-500">
          {rows.length === p.count ? `${p.count} placements` : `${rows.length} of ${p.count} placements`}
          {selected.size ? ` · ${selected.size} selected` : ''}
        </span>
        {filtered ? <span className="text-xs text-ink-500">(canvas dims parts outside the filter)</span> : null}
      </div>
      <div className="overflow-x-auto rounded border border-ink-200 bg-white">
      <div role="table" aria-label="Placements" aria-rowcount={rows.length + 1} className="text-sm" style={{ minWidth: MIN_WIDTH }}>
        <div role="row" className="grid bg-ink-100 text-left text-xs font-medium text-ink-600" style={{ gridTemplateColumns: WIDTHS }}>
          {COLS.map((c) => (
            <div role="columnheader" key={c} className="truncate px-2 py-1.5">
              {c}
            </div>
          ))}
        </div>
        <div ref={scrollRef} className="overflow-auto" style={{ height }}>
          <div role="rowgroup" style={{ height: total, position: 'relative' }}>
            {items.map((vi) => {
              const i = rows[vi.index];
              const sel = selected.has(i);
              return (
                <div
                  role="row"
                  key={i}
                  data-row-id={`${p.board[i]}:${p.ref[i]}`}
                  aria-selected={sel}
                  aria-rowindex={vi.index + 2}
                  tabIndex={0}
                  onClick={(e) => {
                    store.selectParts([i], e.ctrlKey || e.metaKey ? 'toggle' : e.shiftKey ? 'add' : 'replace');
                    store.focusOn(p.x[i], p.y[i], Math.max(p.bodyLength[i] || 0, p.bodyWidth[i] || 0, 1) * 3);
                  }}
                  onKeyDown={(e) => {
                    if (e.key === 'Enter' || e.key === ' ') {
                      e.preventDefault();
                      store.selectParts([i]);
                      store.focusOn(p.x[i], p.y[i], Math.max(p.bodyLength[i] || 0, p.bodyWidth[i] || 0, 1) * 3);
                    }
                  }}
                  className={`absolute left-0 right-0 grid cursor-pointer items-center border-t border-ink-100 hover:bg-copper-50 ${sel ? 'bg-copper-100 font-medium' : ''}`}
                  style={{ top: vi.start, height: ROW_H, gridTemplateColumns: WIDTHS }}
                >
                  <div role="cell" className="num px-2 text-xs text-ink-500">{p.seq[i]}</div>
                  <div role="cell" className="num px-2 text-xs">{p.board[i]}</div>
                  <div role="cell" className="truncate px-2">{p.ref[i]}</div>
                  <div role="cell" className={`truncate px-2 ${p.packageName[i] ? '' : 'text-sev-error'}`}>{p.packageName[i] ?? `none (${p.footprint[i]})`}</div>
                  <div role="cell" className="truncate px-2 text-ink-600">{p.value[i]}</div>
                  <div role="cell" className="num px-2 text-right text-xs">{fixed(p.x[i])}</div>
                  <div role="cell" className="num px-2 text-right text-xs">{fixed(p.y[i])}</div>
                  <div role="cell" className="num px-2 text-right text-xs">{fixed(p.rotation[i])}</div>
                  <div role="cell" className="px-2 text-xs">{p.nozzle[i] ?? '—'}</div>
                  <div role="cell" className="truncate px-2 text-xs text-ink-600">{p.vision[i] ?? '—'}</div>
                </div>
              );
            })}
          </div>
        </div>
      </div>
      </div>
    </div>
  );
}
