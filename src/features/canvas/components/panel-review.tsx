// The review composition: canvas + placement table + findings table with linked selection, layer
// toggles, filters, measure, underlay and comments. Data in, callbacks out: the programs workspace
// stores checked marks, comments and the underlay.
import { useEffect, useMemo, useRef, useState } from 'react';
import type { RunResult, Side } from '../../../../shared/core';
import type { Finding } from '../../../../shared/schemas/finding.schema';
import { Button } from '../../../components/ui/button';
import { buildScene } from '../scene';
import { CanvasStore, useCanvasState } from '../store';
import type { CanvasNote, NewNote, UnderlayState } from '../types';
import { FindingsTable } from './findings-table';
import { LayerToggles } from './layer-toggles';
import { CANVAS_CHROME_PX, PanelCanvas, type DrawStats } from './panel-canvas';
import { PlacementTable } from './placement-table';
import { CommentsList, Filters, MeasureReadout, SideSwitch, ToolBar, UnderlayControls } from './review-panels';

export interface PanelReviewProps {
  /** the engine's result per side (one or both) */
  runs: Partial<Record<Side, RunResult>>;
  /** findings of both sides (each carries its side) */
  findings: readonly Finding[];
  initialSide?: Side;
  /** finding keys marked checked by the reviewer */
  checkedFindingKeys?: ReadonlySet<string>;
  /** the reviewer ticks or unticks findings (one row, or every finding of a box selection) */
  onToggleChecked?: (keys: string[], checked: boolean) => void;
  /** comments pinned on the panel (both sides) */
  comments?: readonly CanvasNote[];
  onAddComment?: (note: NewNote) => void;
  /** the underlay image per side */
  underlays?: Partial<Record<Side, UnderlayState | null>>;
  /** a new image (with its File), a new opacity or alignment, or null when removed */
  onUnderlayChange?: (side: Side, underlay: UnderlayState | null, file?: File) => void;
  canvasHeight?: number;
  onDraw?: (stats: DrawStats) => void;
  /** a finding to show: its side is chosen, it and its parts are selected and the view centres on
   * it (change `seq` to show the same finding again) */
  showFinding?: { key: string; seq: number } | null;
}

/** Where to look for a finding: the middle of what it draws. */
function findingCentre(f: Finding): { x: number; y: number; size: number } {
  const g = f.geometry;
  if (g.type === 'point') return { x: g.x, y: g.y, size: 6 };
  if (g.type === 'segment') return { x: (g.from[0] + g.to[0]) / 2, y: (g.from[1] + g.to[1]) / 2, size: Math.max(6, Math.hypot(g.to[0] - g.from[0], g.to[1] - g.from[1]) * 3) };
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of g.points) {
    minX = Math.min(minX, x); maxX = Math.max(maxX, x);
    minY = Math.min(minY, y); maxY = Math.max(maxY, y);
  }
  return { x: (minX + maxX) / 2, y: (minY + maxY) / 2, size: Math.max(6, (maxX - minX) * 3, (maxY - minY) * 3) };
}

export function PanelReview({
  runs,
  findings,
  initialSide,
  checkedFindingKeys,
  onToggleChecked,
  comments = [],
  onAddComment,
  underlays = {},
  onUnderlayChange,
  canvasHeight = 560,
  onDraw,
  showFinding,
}: PanelReviewProps) {
  const sides = (['top', 'bottom'] as const).filter((s) => runs[s]);
  const [side, setSide] = useState<Side>(initialSide && runs[initialSide] ? initialSide : sides[0] ?? 'top');
  useEffect(() => {
    if (!runs[side] && sides[0]) setSide(sides[0]);
  }, [runs, side, sides]);
  const store = useMemo(() => new CanvasStore(), []);
  const run = runs[side];
  const sideFindings = useMemo(() => findings.filter((f) => f.side === side), [findings, side]);
  const scene = useMemo(() => (run ? buildScene(run, sideFindings) : null), [run, sideFindings]);
  const selectedFindings = useCanvasState(store, (s) => s.selectedFindings);
  useEffect(() => store.setFilters({ packages: [], nozzles: [], kinds: [] }), [side, store]);
  const shownSeq = useRef(0);
  useEffect(() => {
    if (!showFinding || showFinding.seq === shownSeq.current) return;
    const f = findings.find((x) => x.key === showFinding.key);
    if (!f || !runs[f.side]) return;
    if (f.side !== side) {
      setSide(f.side);
      return; // the scene of that side is built first; this runs again with it
    }
    shownSeq.current = showFinding.seq;
    store.selectFindings([f.key]);
    const c = findingCentre(f);
    store.focusOn(c.x, c.y, c.size);
  }, [showFinding, findings, runs, side, store, scene]);

  if (!run || !scene) return <p className="text-sm text-ink-500">Nothing to draw: no side of this panel was run.</p>;
  const underlay = underlays[side] ?? null;
  const selKeys = sideFindings.filter((f) => selectedFindings.has(f.key)).map((f) => f.key);
  const checked = checkedFindingKeys ?? new Set<string>();

  return (
    <div className="flex flex-col gap-3" data-testid="panel-review">
      {/* One line that never wraps: the "Mark checked" button has its place kept (hidden while
          nothing is selected) and the caption shortens, so a selection never moves the canvas. */}
      <div className="flex h-9 flex-nowrap items-center gap-3" data-testid="canvas-toolbar">
        <SideSwitch side={side} sides={[...sides]} onChange={setSide} />
        <ToolBar store={store} canNote={!!onAddComment} />
        {onToggleChecked && (
          <Button
            variant="secondary"
            className={`min-w-[15.5rem] shrink-0 whitespace-nowrap px-2.5 py-1 ${selKeys.length === 0 ? 'invisible' : ''}`}
            aria-hidden={selKeys.length === 0 || undefined}
            tabIndex={selKeys.length === 0 ? -1 : undefined}
            onClick={() => onToggleChecked(selKeys, !selKeys.every((k) => checked.has(k)))}
          >
            {selKeys.length > 0 && selKeys.every((k) => checked.has(k)) ? 'Untick' : 'Mark checked'}: {selKeys.length} selected finding{selKeys.length === 1 ? '' : 's'}
          </Button>
        )}
        <span className="ml-auto min-w-0 truncate text-xs text-ink-500" title={`${run.program ?? 'program'} ${run.revision ? `rev ${run.revision}` : ''} · ${run.boardsPlaced} boards · ${run.placements.count} placements on this side`}>
          {run.program ?? 'program'} {run.revision ? `rev ${run.revision}` : ''} · {run.boardsPlaced} boards · {run.placements.count} placements on this side
        </span>
      </div>
      <div className="grid gap-3" style={{ gridTemplateColumns: 'minmax(0, 1fr) 15rem' }}>
        <PanelCanvas
          run={run}
          findings={sideFindings}
          store={store}
          scene={scene}
          checkedFindingKeys={checkedFindingKeys}
          notes={comments}
          onAddNote={onAddComment}
          underlay={underlay}
          onUnderlayChange={onUnderlayChange ? (u) => onUnderlayChange(side, u) : undefined}
          height={canvasHeight}
          onDraw={onDraw}
        />
        <aside aria-label="Canvas controls" className="flex flex-col gap-4 overflow-y-auto rounded border border-ink-200 bg-ink-50 p-3" style={{ maxHeight: canvasHeight + CANVAS_CHROME_PX }}>
          <LayerToggles store={store} hasUnderlay={!!underlay} />
          <Filters store={store} run={run} findings={sideFindings} />
          <MeasureReadout store={store} scene={scene} />
          {onUnderlayChange && <UnderlayControls side={side} scene={scene} underlay={underlay} store={store} onChange={(u, f) => onUnderlayChange(side, u, f)} />}
          <CommentsList notes={comments} side={side} store={store} />
        </aside>
      </div>
      <div className="grid gap-3 2xl:grid-cols-2">
        <section aria-label="Placement table">
          <h2 className="mb-1 text-sm font-semibold text-ink-800">Placements</h2>
          <PlacementTable run={run} store={store} />
        </section>
        <section aria-label="Findings table">
          <h2 className="mb-1 text-sm font-semibold text-ink-800">Findings</h2>
          <FindingsTable findings={sideFindings} store={store} checkedFindingKeys={checkedFindingKeys} onToggleChecked={onToggleChecked} height={352} />
        </section>
      </div>
    </div>
  );
}
