// The panel drawn to scale: Konva layers with one batch-drawing shape each, our own pointer and
// keyboard handling, hit testing through the body index. Draws what the engine computed.
// Frame scheduling, the pointer and the keyboard live in ../hooks (use-frame-scheduler,
// use-canvas-pointer, use-canvas-keys); the layers are drawn by ../draw.
import Konva from 'konva';
import { useCallback, useEffect, useMemo, useRef } from 'react';
import { Layer, Shape, Stage } from 'react-konva';
import { applyAffine, fitView, type ViewTransform } from '../../../../shared/canvas';
import type { RunResult } from '../../../../shared/core';
import type { Finding } from '../../../../shared/schemas/finding.schema';
import { drawBase, drawBodies, drawFindings, drawOverlay, drawUnderlay, type CanvasNote } from '../draw';
import { useCanvasKeys } from '../hooks/use-canvas-keys';
import { useCanvasPointer, type CanvasExtras } from '../hooks/use-canvas-pointer';
import { useElementSize } from '../hooks/use-element-size';
import { DIRTY_ALL, DIRTY_BASE, DIRTY_BODIES, DIRTY_OVERLAY, DIRTY_UNDERLAY, useFrameScheduler, type DrawStats } from '../hooks/use-frame-scheduler';
import { CANVAS_COLORS } from '../palette';
import { buildScene, dimMask, type Scene } from '../scene';
import { CanvasStore, type CanvasState } from '../store';
import type { NewNote, UnderlayState } from '../types';
import { CursorReadout, HelpPopover, HoverCard, NoteEditor, ScaleBar, SideBadge } from './canvas-chrome';

export type { DrawStats };

export interface PanelCanvasProps {
  /** one side of one panel, as the engine produced it */
  run: RunResult;
  /** findings of the job (only those of `run.side` are drawn) */
  findings: readonly Finding[];
  /** shared with the tables (PanelReview passes one); a private store otherwise */
  store?: CanvasStore;
  /** buildScene(run, findings) when the caller already has it (PanelReview does) */
  scene?: Scene;
  /** finding keys the reviewer has marked checked (drawn faint and dashed) */
  checkedFindingKeys?: ReadonlySet<string>;
  /** comments pinned at output-frame coordinates */
  notes?: readonly CanvasNote[];
  /** the note tool was used: a new comment at a point */
  onAddNote?: (note: NewNote) => void;
  underlay?: UnderlayState | null;
  onUnderlayChange?: (u: UnderlayState | null) => void;
  /** canvas height in px (the width follows the container) */
  height?: number;
  /** called after every draw pass (the benchmark reads it) */
  onDraw?: (stats: DrawStats) => void;
  /** accessible name of the canvas region */
  label?: string;
}

/** Height of the strips above and below the drawing (px); the component is `height` + 2 strips + 2 px of border. */
export const CANVAS_STRIP_PX = 32;
export const CANVAS_CHROME_PX = 2 * CANVAS_STRIP_PX + 2;

export function PanelCanvas({
  run,
  findings,
  store: given,
  scene: givenScene,
  checkedFindingKeys,
  notes = [],
  onAddNote,
  underlay = null,
  onUnderlayChange,
  height = 560,
  onDraw,
  label,
}: PanelCanvasProps) {
  const own = useMemo(() => new CanvasStore(), []);
  const store = given ?? own;
  const scene = useMemo(() => givenScene ?? buildScene(run, findings), [givenScene, run, findings]);
  const containerRef = useRef<HTMLDivElement>(null);
  const size = useElementSize(containerRef, { width: 900, height });
  const width = size.width;

  // everything the draw functions read lives in refs: a pan never re-renders React
  const sceneRef = useRef<Scene>(scene);
  const sizeRef = useRef({ width, height });
  const dimRef = useRef<Uint8Array | null>(null);
  const imageRef = useRef<HTMLImageElement | null>(null);
  const underlayRef = useRef(underlay);
  const extrasRef = useRef<CanvasExtras>({ checked: checkedFindingKeys ?? new Set<string>(), notes, box: null, pendingNote: null, alignImage: [], alignPanel: [] });
  const layerRefs = { underlay: useRef<Konva.Layer>(null), base: useRef<Konva.Layer>(null), bodies: useRef<Konva.Layer>(null), overlay: useRef<Konva.Layer>(null) };
  const { schedule, idleTimer } = useFrameScheduler(layerRefs, onDraw);

  // ---- keep refs current -----------------------------------------------------------------------
  useEffect(() => {
    sceneRef.current = scene;
    store.links = scene.links;
    dimRef.current = dimMask(scene, store.getState().filters);
    contentVersion.current++;
    store.set({ selected: new Set(), selectedFindings: new Set(), hovered: -1, measure: [] });
    schedule(DIRTY_ALL);
  }, [scene, store, schedule]);

  useEffect(() => {
    extrasRef.current.checked = checkedFindingKeys ?? new Set();
    extrasRef.current.notes = notes;
    contentVersion.current++;
    schedule(DIRTY_BODIES | DIRTY_OVERLAY);
  }, [checkedFindingKeys, notes, schedule]);

  useEffect(() => {
    underlayRef.current = underlay;
    if (!underlay) {
      imageRef.current = null;
      schedule(DIRTY_UNDERLAY | DIRTY_BASE);
      return;
    }
    if (imageRef.current?.src === underlay.url || imageRef.current?.dataset.url === underlay.url) {
      schedule(DIRTY_UNDERLAY | DIRTY_BASE | DIRTY_OVERLAY);
      return;
    }
    const img = new Image();
    img.dataset.url = underlay.url;
    img.onload = () => {
      imageRef.current = img;
      schedule(DIRTY_UNDERLAY | DIRTY_BASE | DIRTY_OVERLAY);
    };
    img.src = underlay.url;
  }, [underlay, schedule]);

  // fit when the run or the size changes
  const fit = useCallback(() => {
    const { width: w, height: h } = sizeRef.current;
    store.set({ view: fitView(sceneRef.current.bounds, w, h, 28) });
  }, [store]);
  useEffect(() => {
    sizeRef.current = { width, height };
    contentVersion.current++;
    fit();
  }, [width, height, scene, fit]);

  // the view and the selection as data attributes, for browser tests and the benchmark
  const publish = useCallback((s: CanvasState) => {
    const el = containerRef.current;
    if (!el) return;
    if (s.view) el.dataset.view = `${s.view.s},${s.view.ox},${s.view.oy}`;
    const p = sceneRef.current.run.placements;
    el.dataset.selection = [...s.selected].slice(0, 50).map((i) => `${p.board[i]}:${p.ref[i]}`).join(' ');
  }, []);

  // store → which layers to redraw
  useEffect(() => {
    let prev = store.getState();
    publish(prev);
    schedule(DIRTY_ALL);
    return store.subscribe(() => {
      const s = store.getState();
      if (s === prev) return;
      // `prev` moves first: the fit and focus below set the store again, re-entering here
      const was = prev;
      prev = s;
      let d = 0;
      if (s.view !== was.view) {
        d = DIRTY_ALL;
        lastViewChange.current = performance.now();
        clearTimeout(idleTimer.current);
        idleTimer.current = window.setTimeout(() => schedule(DIRTY_BODIES), 160);
      }
      if (s.layers !== was.layers) {
        contentVersion.current++;
        d = DIRTY_ALL;
      }
      if (s.filters !== was.filters) {
        dimRef.current = dimMask(sceneRef.current, s.filters);
        contentVersion.current++;
        d |= DIRTY_BODIES | DIRTY_OVERLAY;
      }
      if (s.selected !== was.selected || s.selectedFindings !== was.selectedFindings || s.hovered !== was.hovered || s.measure !== was.measure || s.tool !== was.tool) d |= DIRTY_OVERLAY;
      if (s.fitRequest !== was.fitRequest) fit();
      if (s.focus && s.focus !== was.focus && s.view) {
        const { width: w, height: h } = sizeRef.current;
        const v = s.view;
        // zoom so that the thing shown fills about a third of the view (at most 60 px/mm)
        const size = s.focus.size;
        const k = size ? Math.min(60, Math.max(0.5, Math.min(w, h) / (3 * Math.max(size, 1)))) : Math.max(v.s, 8);
        store.set({ view: { s: k, ox: w / 2 - k * s.focus.x, oy: h / 2 + k * s.focus.y } });
      }
      if (s.tool !== was.tool && s.tool !== 'align') {
        extrasRef.current.alignImage = [];
        extrasRef.current.alignPanel = [];
      }
      if (d) schedule(d);
      publish(store.getState());
    });
  }, [store, schedule, fit, publish]);

  // ---- scene functions -------------------------------------------------------------------------
  const vp = () => ({ view: store.getState().view as ViewTransform, width: sizeRef.current.width, height: sizeRef.current.height });
  const native = (c: Konva.Context) => c._context as CanvasRenderingContext2D;
  const sceneUnderlay = (c: Konva.Context) => {
    const s = store.getState();
    const u = underlayRef.current;
    if (!s.view || !u || !imageRef.current || !s.layers.underlay) return;
    drawUnderlay(native(c), vp(), imageRef.current, u.transform, u.opacity);
  };
  const sceneBase = (c: Konva.Context) => {
    const s = store.getState();
    if (s.view) drawBase(native(c), sceneRef.current, vp(), s.layers, !!(underlayRef.current && imageRef.current && s.layers.underlay));
  };
  // Bodies and findings are the costly part: they are drawn into a bitmap (the viewport and a
  // quarter of a viewport around it) which a pan or a zoom only moves and scales; 150 ms after the view stops
  // changing, and whenever the bitmap no longer covers the view, it is drawn again, sharp.
  const cache = useRef<{ canvas: HTMLCanvasElement | null; view: ViewTransform | null; version: number; w: number; h: number }>({ canvas: null, view: null, version: -1, w: 0, h: 0 });
  const contentVersion = useRef(0);
  const lastViewChange = useRef(0);
  const renderCache = (s: CanvasState) => {
    const { width: W, height: H } = sizeRef.current;
    const pr = Konva.pixelRatio || 1;
    const mx = Math.round(W / 4), my = Math.round(H / 4);
    const cw = W + 2 * mx, ch = H + 2 * my;
    const cc = cache.current;
    if (!cc.canvas) cc.canvas = document.createElement('canvas');
    if (cc.canvas.width !== cw * pr || cc.canvas.height !== ch * pr) {
      cc.canvas.width = cw * pr;
      cc.canvas.height = ch * pr;
    }
    const ctx = cc.canvas.getContext('2d')!;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, cc.canvas.width, cc.canvas.height);
    ctx.setTransform(pr, 0, 0, pr, 0, 0);
    const view = { s: s.view!.s, ox: s.view!.ox + mx, oy: s.view!.oy + my };
    const cvp = { view, width: cw, height: ch };
    drawBodies(ctx, sceneRef.current, cvp, s.layers, dimRef.current);
    if (s.layers.findings) {
      const kinds = s.filters.kinds;
      drawFindings(ctx, sceneRef.current, cvp, { checked: extrasRef.current.checked, findingDim: kinds.length ? (f) => !kinds.includes(f.kind) : null });
    }
    cc.view = view;
    cc.version = contentVersion.current;
    cc.w = cw;
    cc.h = ch;
  };
  const sceneBodies = (c: Konva.Context) => {
    const s = store.getState();
    if (!s.view) return;
    const cc = cache.current;
    const { width: W, height: H } = sizeRef.current;
    const moving = performance.now() - lastViewChange.current < 150;
    let fresh = !cc.canvas || !cc.view || cc.version !== contentVersion.current || !moving;
    const k = cc.view ? s.view.s / cc.view.s : 1;
    const x0 = cc.view ? s.view.ox - k * cc.view.ox : 0;
    const y0 = cc.view ? s.view.oy - k * cc.view.oy : 0;
    if (!fresh && (x0 > 0 || y0 > 0 || x0 + cc.w * k < W || y0 + cc.h * k < H || k > 4)) fresh = true;
    if (fresh && cc.view && cc.version === contentVersion.current && cc.view.s === s.view.s && cc.view.ox === s.view.ox + Math.round(W / 4) && cc.view.oy === s.view.oy + Math.round(H / 4)) fresh = false;
    if (fresh) renderCache(s);
    const v = cc.view!;
    const kk = s.view.s / v.s;
    const ctx = native(c);
    // no smoothing while the view moves (the sharp redraw follows when it stops)
    ctx.imageSmoothingEnabled = false;
    ctx.drawImage(cc.canvas!, s.view.ox - kk * v.ox, s.view.oy - kk * v.oy, cc.w * kk, cc.h * kk);
  };
  const sceneOverlay = (c: Konva.Context) => {
    const s = store.getState();
    if (!s.view) return;
    const e = extrasRef.current;
    const u = underlayRef.current;
    drawOverlay(native(c), sceneRef.current, vp(), {
      layers: s.layers,
      selected: s.selected,
      selectedFindings: s.selectedFindings,
      hovered: s.hovered,
      measure: s.measure,
      notes: e.notes,
      dim: dimRef.current,
      alignImage: u ? e.alignImage.map((q) => applyAffine(u.transform, q.x, q.y)) : [],
      alignPanel: e.alignPanel,
      box: e.box,
      pendingNote: e.pendingNote,
    });
  };

  // ---- pointer, wheel and underlay alignment (../hooks/use-canvas-pointer) -----------------------
  const { drag, pendingNote, setPendingNote, alignStep, alignError, hoverXY, tool, onPointerDown, onPointerMove, onPointerUp, onPointerLeave } = useCanvasPointer({
    store, containerRef, sceneRef, extrasRef, underlayRef, schedule, onUnderlayChange,
  });

  // ---- keyboard: our own shortcuts (../hooks/use-canvas-keys) -------------------------------------
  const { helpOpen, setHelpOpen, onKeyDown } = useCanvasKeys({ store, containerRef, sizeRef, fit, canNote: !!onAddNote });

  const submitNote = (text: string) => {
    const p = extrasRef.current.pendingNote;
    if (p && text.trim()) onAddNote?.({ side: run.side, x: p.x, y: p.y, text: text.trim() });
    extrasRef.current.pendingNote = null;
    setPendingNote(null);
    schedule(DIRTY_OVERLAY);
    containerRef.current?.focus();
  };

  const cursorStyle = tool === 'select' ? (drag.current?.mode === 'pan' ? 'grabbing' : 'default') : 'crosshair';
  const sideText = run.side === 'top' ? 'Top side, seen from above' : 'Bottom side, seen from below';
  return (
    // A strip above and below the drawing holds its chrome (side and frame, alignment status, help;
    // scale bar and cursor read-out), so that nothing covers the drawing's working area.
    <div className="flex select-none flex-col overflow-hidden rounded border border-ink-700" style={{ background: CANVAS_COLORS.background }}>
      <div className="relative flex items-center gap-3 border-b border-ink-800 bg-ink-900 px-2 text-xs text-ink-100" style={{ height: CANVAS_STRIP_PX }}>
        <SideBadge run={run} />
        {(alignStep || alignError) && (
          <span role="status" className={`min-w-0 truncate rounded px-2 py-0.5 ${alignError ? 'bg-sev-error text-white' : 'bg-copper-700 text-white'}`}>
            {alignError ?? alignStep}
          </span>
        )}
        <HelpPopover open={helpOpen} onOpenChange={setHelpOpen} canNote={!!onAddNote} />
      </div>
      <div className="relative" style={{ height }}>
        <div
          ref={containerRef}
          role="application"
          aria-label={label ?? `Panel canvas: ${sideText}. Press ? for keyboard shortcuts.`}
          aria-roledescription="panel canvas"
          tabIndex={0}
          data-testid="panel-canvas"
          data-side={run.side}
          className="absolute inset-0 outline-none focus-visible:ring-2 focus-visible:ring-inset focus-visible:ring-copper-400"
          style={{ cursor: cursorStyle, touchAction: 'none' }}
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={onPointerUp}
          onPointerLeave={onPointerLeave}
          onKeyDown={onKeyDown}
        >
          <Stage width={width} height={height} listening={false}>
            <Layer ref={layerRefs.underlay} listening={false}>
              <Shape sceneFunc={sceneUnderlay} listening={false} perfectDrawEnabled={false} />
            </Layer>
            <Layer ref={layerRefs.base} listening={false}>
              <Shape sceneFunc={sceneBase} listening={false} perfectDrawEnabled={false} />
            </Layer>
            <Layer ref={layerRefs.bodies} listening={false}>
              <Shape sceneFunc={sceneBodies} listening={false} perfectDrawEnabled={false} />
            </Layer>
            <Layer ref={layerRefs.overlay} listening={false}>
              <Shape sceneFunc={sceneOverlay} listening={false} perfectDrawEnabled={false} />
            </Layer>
          </Stage>
        </div>
        <HoverCard store={store} scene={scene} pos={hoverXY} width={width} height={height} />
        {pendingNote && <NoteEditor store={store} at={pendingNote} onSubmit={submitNote} onCancel={() => submitNote('')} />}
      </div>
      <div className="flex items-center justify-between gap-3 border-t border-ink-800 bg-ink-900 px-2 text-xs text-ink-100" style={{ height: CANVAS_STRIP_PX }}>
        <ScaleBar store={store} />
        <CursorReadout store={store} scene={scene} />
      </div>
    </div>
  );
}

export type { CanvasState };