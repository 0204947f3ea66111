// The review composition: canvas + placement table + findings table with linked selection, layer
// toggles, filters, measure, underlay and comments. Data in, callbacks out: the programs workspace
// stores checked marks, comments and the underlay.
import { useEffect, useMemo, useState } from 'react';
import type { RunResult, Side } from '../../../../shared/pipeline/types';
import type { Finding } from '../../../../shared/schemas/finding.schema';
import { Button } from '../../../components/ui/button';
import { buildScene } from '../scene';
import { CanvasStore, useCanvasState } from '../store';
import type { CanvasNote, NewNote, UnderlayState } from '../types';
import { FindingsTable } from './findings-table';
import { LayerToggles } from './layer-toggles';
import { PanelCanvas, type DrawStats } from './panel-canvas';
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

  if (!run || !scene) return <p className="text-sm text-ink-500">Nothing to draw: no side of this panel was run.</p>;
  const underlay = underlays[side] ?? null;
  const selKeys = sideFindings.filter((f) => selectedFindings.has(f.key)).map((f) => f.key);
  const checked = checkedFindingKeys ?? new Set<string>();

  return (
    <div className="flex flex-col gap-3" data-testid="panel-review">
      <div className="flex flex-wrap items-center gap-3">
        <SideSwitch side={side} sides={[...sides]} onChange={setSide} />
        <ToolBar store={store} canNote={!!onAddComment} />
        {onToggleChecked && selKeys.length > 0 && (
          <Button variant="secondary" className="px-2.5 py-1" onClick={() => onToggleChecked(selKeys, !selKeys.every((k) => checked.has(k)))}>
            {selKeys.every((k) => checked.has(k)) ? 'Untick' : 'Mark checked'}: {selKeys.length} selected finding{selKeys.length === 1 ? '' : 's'}
          </Button>
        )}
        <span className="ml-auto text-xs text-ink-500">
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
        <aside aria-label="Canvas controls" className="flex flex-col gap-4 overflow-y-auto rounded border border-ink-200 bg-ink-50 p-3" style={{ maxHeight: canvasHeight }}>
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
