import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useRef, useState, type ReactNode } from 'react';

interface DataTableProps<T> {
  data: T[];
  columns: ColumnDef<T, any>[];
  /** Accessible name of the table. */
  label: string;
  getRowId?: (row: T, index: number) => string;
  onRowClick?: (row: T) => void;
  selectedIds?: ReadonlySet<string>;
  empty?: ReactNode;
  /** Height of the scrolling body in px; rows are virtualised. */
  height?: number;
  toolbar?: ReactNode;
  initialSorting?: SortingState;
}

const ROW_H = 34;
/** Up to this many rows are all in the DOM; more are virtualised. */
const VIRTUAL_ABOVE = 300;

/**
 * Sortable, filterable table; only the visible rows are in the DOM, so thousands of rows scroll
 * smoothly. Click a header to sort (shift-click adds a second key); type in the filter to narrow.
 */
export function DataTable<T>({ data, columns, label, getRowId, onRowClick, selectedIds, empty, height = 480, toolbar, initialSorting = [] }: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState('');
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId,
    // First click sorts ascending for every column, numbers included.
    sortDescFirst: false,
  });
  const rows = table.getRowModel().rows;
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtual = rows.length > VIRTUAL_ABOVE;
  const virtualizer = useVirtualizer({ count: virtual ? rows.length : 0, getScrollElement: () => scrollRef.current, estimateSize: () => ROW_H, overscan: 12 });
  const items = virtual ? virtualizer.getVirtualItems() : rows.map((_, index) => ({ index, start: index * ROW_H, end: (index + 1) * ROW_H }));
  const padTop = virtual && items.length ? items[0].start : 0;
  const padBottom = virtual && items.length ? virtualizer.getTotalSize() - items[items.length - 1].end : 0;
  const colCount = table.getVisibleLeafColumns().length;

  return (
    <div className="flex flex-col gap-2">
      <div className="flex items-center gap-2">
        <input
          type="search"
          aria-label={`Filter ${label}`}
          placeholder="Filter…"
          value={globalFilter}
          onChange={(e) => setGlobalFilter(e.target.value)}
          className="w-64 rounded border border-ink-300 bg-white px-2 py-1 text-sm"
        />
        <span className="num text-xs text-ink-500">
          {rows.length === data.length ? `${data.length} rows` : `${rows.length} of ${data.length} rows`}
        </span>
        <div className="ml-auto flex items-center gap-2">{toolbar}</div>
      </div>
      <div ref={scrollRef} className="overflow-auto rounded border border-ink-200 bg-white" style={{ maxHeight: height }}>
        <table aria-label={label} className="w-full border-collapse text-sm">
          <thead className="sticky top-0 z-10 bg-ink-100 text-left text-xs text-ink-600">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th key={h.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'} className="whitespace-nowrap px-3 py-2 font-medium">
                      {h.isPlaceholder ? null : h.column.getCanSort() ? (
                        <button type="button" className="inline-flex items-center gap-1 hover:text-ink-900" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-copper-500">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={colCount} className="px-3 py-8 text-center text-ink-500">
                  {globalFilter ? 'No rows match the filter.' : (empty ?? 'Nothing here yet.')}
                </td>
              </tr>
            ) : (
              <>
                {padTop > 0 && <tr style={{ height: padTop }} aria-hidden />}
                {items.map((vi) => {
                  const row = rows[vi.index];
                  const selected = selectedIds?.has(row.id);
                  return (
                    <tr
                      key={row.id}
                      data-row-id={row.id}
                      aria-selected={selected || undefined}
                      onClick={onRowClick ? () => onRowClick(row.original) : undefined}
                      onKeyDown={onRowClick ? (e) => e.key === 'Enter' && onRowClick(row.original) : undefined}
                      tabIndex={onRowClick ? 0 : undefined}
                      className={`border-t border-ink-100 ${onRowClick ? 'cursor-pointer hover:bg-copper-50' : ''} ${selected ? 'bg-copper-100' : ''}`}
                      style={{ height: ROW_H }}
                    >
                      {row.getVisibleCells().map((cell) => (
                        <td key={cell.id} className="whitespace-nowrap px-3 py-1.5">
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      ))}
                    </tr>
                  );
                })}
                {padBottom > 0 && <tr style={{ height: padBottom }} aria-hidden />}
              </>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
