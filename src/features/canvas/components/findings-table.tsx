// Findings of the shown side, linked to the canvas, with the reviewer's "checked" marks.
import { useEffect, useMemo, useRef } from 'react';
import type { Finding } from '../../../../shared/schemas/finding.schema';
import { Badge } from '../../../components/ui/misc';
import { mm } from '../../../lib/format';
import { findingBox } from '../scene';
import { useCanvasState, type CanvasStore } from '../store';
import { scrollWithin } from './scroll';

const ROW_CAP = 400;

export interface FindingsTableProps {
  findings: readonly Finding[];
  store: CanvasStore;
  checkedFindingKeys?: ReadonlySet<string>;
  onToggleChecked?: (keys: string[], checked: boolean) => void;
  height?: number;
}

export function FindingsTable({ findings, store, checkedFindingKeys, onToggleChecked, height = 260 }: FindingsTableProps) {
  const selected = useCanvasState(store, (s) => s.selectedFindings);
  const kinds = useCanvasState(store, (s) => s.filters.kinds);
  const all = useMemo(() => (kinds.length ? findings.filter((f) => kinds.includes(f.kind)) : findings), [findings, kinds]);
  // a pathological panel can have thousands of findings: the first ROW_CAP rows are listed, plus
  // any selected one further down, so that a selection on the canvas always shows its row
  const rows = useMemo(() => (all.length <= ROW_CAP ? all : [...all.slice(0, ROW_CAP), ...all.slice(ROW_CAP).filter((f) => selected.has(f.key))]), [all, selected]);
  const scrollRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const first = rows.find((f) => selected.has(f.key));
    if (!first) return;
    scrollWithin(scrollRef.current, scrollRef.current?.querySelector(`[data-row-id="${CSS.escape(first.key)}"]`) as HTMLElement | null);
  }, [selected, rows]);
  const checked = checkedFindingKeys ?? new Set<string>();
  const nChecked = findings.filter((f) => checked.has(f.key)).length;
  return (
    <div className="flex flex-col gap-1.5">
      <p className="num text-xs text-ink-500">
        {findings.length} findings on this side · {nChecked} checked
        {kinds.length ? ` · ${all.length} of this kind` : ''}
        {all.length > ROW_CAP ? ` · listing the first ${ROW_CAP} (narrow by kind)` : ''}
      </p>
      <div ref={scrollRef} className="overflow-auto rounded border border-ink-200 bg-white" style={{ maxHeight: height }}>
        <table aria-label="Findings" className="w-full border-collapse text-sm">
          <thead className="sticky top-0 z-10 bg-ink-100 text-left text-xs text-ink-600">
            <tr>
              <th scope="col" className="px-2 py-1.5 font-medium">Checked</th>
              <th scope="col" className="px-2 py-1.5 font-medium">Severity</th>
              <th scope="col" className="px-2 py-1.5 font-medium">Kind</th>
              <th scope="col" className="px-2 py-1.5 font-medium">Parts</th>
              <th scope="col" className="px-2 py-1.5 font-medium">Depth</th>
              <th scope="col" className="px-2 py-1.5 font-medium">Message</th>
            </tr>
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-6 text-center text-ink-500">
                  {findings.length ? 'No finding of the chosen kind.' : 'No findings on this side.'}
                </td>
              </tr>
            ) : (
              rows.map((f) => {
                const sel = selected.has(f.key);
                const isChecked = checked.has(f.key);
                const pick = (mode: 'replace' | 'add' | 'toggle') => {
                  store.selectFindings([f.key], mode);
                  const b = findingBox(f);
                  store.focusOn((b.minX + b.maxX) / 2, (b.minY + b.maxY) / 2, Math.max(b.maxX - b.minX, b.maxY - b.minY, 2));
                };
                return (
                  <tr
                    key={f.key}
                    data-row-id={f.key}
                    aria-selected={sel}
                    tabIndex={0}
                    onClick={(e) => pick(e.ctrlKey || e.metaKey ? 'toggle' : e.shiftKey ? 'add' : 'replace')}
                    onKeyDown={(e) => e.key === 'Enter' && pick('replace')}
                    className={`cursor-pointer border-t border-ink-100 hover:bg-copper-50 ${sel ? 'bg-copper-100' : ''} ${isChecked ? 'text-ink-500' : ''}`}
                  >
                    <td className="px-2 py-1" onClick={(e) => e.stopPropagation()}>
                      <input
                        type="checkbox"
                        aria-label={`Checked: ${f.kind} ${f.refs.join(', ') || 'panel'}`}
                        checked={isChecked}
                        disabled={!onToggleChecked}
                        onChange={(e) => onToggleChecked?.([f.key], e.target.checked)}
                      />
                    </td>
                    <td className="px-2 py-1">
                      <Badge tone={f.severity === 'error' ? 'error' : 'warning'}>{f.severity}</Badge>
                    </td>
                    <td className="whitespace-nowrap px-2 py-1">{f.kind}</td>
                    <td className="px-2 py-1 text-xs">{f.refs.length ? f.refs.join(', ') : f.boards.length ? `boards ${f.boards.join(', ')}` : 'panel'}</td>
                    <td className="num whitespace-nowrap px-2 py-1 text-xs">{f.depth == null ? '—' : mm(f.depth)}</td>
                    <td className="px-2 py-1 text-xs text-ink-700">{f.message}</td>
                  </tr>
                );
              })
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
