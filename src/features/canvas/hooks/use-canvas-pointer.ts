// Pointer handling of the panel canvas: drag to pan, Shift+drag to box-select, click to select (or
// to measure, pin a comment, align the underlay with the active tool), hover, wheel zoom about the
// cursor. Hit testing goes through the body index.
import { useEffect, useRef, useState, type RefObject } from 'react';
import { applyAffine, fitUnderlay, hitBox, hitPoint, invertAffine, panBy, screenToWorld, zoomAbout } from '../../../../shared/canvas';
import type { OverlayState } from '../draw';
import type { Scene } from '../scene';
import { useCanvasState, type CanvasStore } from '../store';
import type { UnderlayState } from '../types';
import { DIRTY_OVERLAY } from './use-frame-scheduler';

/** What the overlay draws besides the store: set by the props and by the pointer. */
export interface CanvasExtras {
  checked: ReadonlySet<string>;
  notes: OverlayState['notes'];
  box: OverlayState['box'];
  pendingNote: { x: number; y: number } | null;
  alignImage: { x: number; y: number }[];
  alignPanel: { x: number; y: number }[];
}

interface PointerDeps {
  store: CanvasStore;
  containerRef: RefObject<HTMLDivElement | null>;
  sceneRef: RefObject<Scene>;
  extrasRef: RefObject<CanvasExtras>;
  underlayRef: RefObject<UnderlayState | null>;
  schedule: (mask: number) => void;
  onUnderlayChange?: (u: UnderlayState | null) => void;
}

/** A turn in (−180, 180], 2 decimals, without a "-0.00". */
const signedTurn = (d: number) => {
  const v = d > 180 ? d - 360 : d;
  return Math.abs(v) < 0.005 ? '0.00' : v.toFixed(2);
};

const CLICK_SLOP = 4;

export function useCanvasPointer({ store, containerRef, sceneRef, extrasRef, underlayRef, schedule, onUnderlayChange }: PointerDeps) {
  const drag = useRef<{ x: number; y: number; sx: number; sy: number; mode: 'pan' | 'box'; moved: boolean; id: number } | null>(null);
  const [pendingNote, setPendingNote] = useState<{ x: number; y: number } | null>(null);
  const [alignStep, setAlignStep] = useState<string | null>(null);
  const [alignError, setAlignError] = useState<string | null>(null);
  const hoverPos = useRef({ x: 0, y: 0 });
  const [hoverXY, setHoverXY] = useState({ x: 0, y: 0 });

  const local = (e: { clientX: number; clientY: number }) => {
    const r = containerRef.current!.getBoundingClientRect();
    return { x: e.clientX - r.left, y: e.clientY - r.top };
  };
  const visibleAccept = () => (store.getState().layers.bodies ? undefined : () => false);

  const onPointerDown = (e: React.PointerEvent<HTMLDivElement>) => {
    containerRef.current?.focus({ preventScroll: true });
    const p = local(e);
    const box = e.shiftKey && e.button === 0 && store.getState().tool === 'select';
    drag.current = { x: p.x, y: p.y, sx: p.x, sy: p.y, mode: box ? 'box' : 'pan', moved: false, id: e.pointerId };
    try {
      (e.target as Element).setPointerCapture?.(e.pointerId);
    } catch {
      // a synthetic pointer (tests, the benchmark) cannot be captured
    }
  };

  const onPointerMove = (e: React.PointerEvent<HTMLDivElement>) => {
    const p = local(e);
    const s = store.getState();
    if (!s.view) return;
    const d = drag.current;
    if (d) {
      if (!d.moved && Math.hypot(p.x - d.sx, p.y - d.sy) > CLICK_SLOP) d.moved = true;
      if (d.moved && d.mode === 'pan') {
        store.set({ view: panBy(s.view, p.x - d.x, p.y - d.y) });
      } else if (d.moved && d.mode === 'box') {
        extrasRef.current.box = { x0: d.sx, y0: d.sy, x1: p.x, y1: p.y };
        schedule(DIRTY_OVERLAY);
      }
      d.x = p.x;
      d.y = p.y;
    }
    const w = screenToWorld(s.view, p.x, p.y);
    const hit = d?.moved ? -1 : hitPoint(sceneRef.current.index, w.x, w.y, 2 / s.view.s, visibleAccept());
    hoverPos.current = p;
    if (hit !== s.hovered) {
      setHoverXY(p);
      store.set({ hovered: hit, cursor: w });
    } else {
      store.set({ cursor: w });
      if (hit >= 0) setHoverXY(p);
    }
  };

  const clickAt = (p: { x: number; y: number }, e: { shiftKey: boolean; ctrlKey: boolean; metaKey: boolean }) => {
    const s = store.getState();
    if (!s.view) return;
    const w = screenToWorld(s.view, p.x, p.y);
    const sc = sceneRef.current;
    const tol = 3 / s.view.s;
    const hit = hitPoint(sc.index, w.x, w.y, tol, visibleAccept());
    if (s.tool === 'measure') {
      const snap = hit >= 0 ? { x: sc.run.placements.x[hit], y: sc.run.placements.y[hit], part: hit } : { x: w.x, y: w.y, part: -1 };
      store.addMeasurePoint(snap);
      return;
    }
    if (s.tool === 'note') {
      extrasRef.current.pendingNote = w;
      setPendingNote(w);
      schedule(DIRTY_OVERLAY);
      return;
    }
    if (s.tool === 'align') {
      alignClick(w);
      return;
    }
    const mode = e.ctrlKey || e.metaKey ? 'toggle' : e.shiftKey ? 'add' : 'replace';
    if (hit >= 0) {
      store.selectParts([hit], mode);
      return;
    }
    if (s.layers.findings) {
      const pad = 6 / s.view.s;
      const k = sc.findingBoxes.findIndex((b) => w.x >= b.minX - pad && w.x <= b.maxX + pad && w.y >= b.minY - pad && w.y <= b.maxY + pad);
      if (k >= 0) {
        store.selectFindings([sc.findings[k].key], mode);
        return;
      }
    }
    if (mode === 'replace') store.clearSelection();
  };

  const onPointerUp = (e: React.PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    drag.current = null;
    if (!d) return;
    const p = local(e);
    const s = store.getState();
    if (!d.moved) {
      clickAt(p, e);
      return;
    }
    if (d.mode === 'box' && s.view) {
      extrasRef.current.box = null;
      const a = screenToWorld(s.view, d.sx, d.sy);
      const b = screenToWorld(s.view, p.x, p.y);
      const sc = sceneRef.current;
      const parts = hitBox(sc.index, { minX: Math.min(a.x, b.x), minY: Math.min(a.y, b.y), maxX: Math.max(a.x, b.x), maxY: Math.max(a.y, b.y) }, sc.run.placements.x, sc.run.placements.y, visibleAccept());
      store.selectParts(parts, e.ctrlKey || e.metaKey ? 'toggle' : 'add');
      schedule(DIRTY_OVERLAY);
    }
  };

  const onPointerLeave = () => {
    if (store.getState().hovered !== -1 || store.getState().cursor) store.set({ hovered: -1, cursor: null });
  };

  // wheel: zoom about the cursor (a native listener: React's wheel listener is passive)
  useEffect(() => {
    const el = containerRef.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const s = store.getState();
      if (!s.view) return;
      const r = el.getBoundingClientRect();
      const dy = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaY;
      store.set({ view: zoomAbout(s.view, e.clientX - r.left, e.clientY - r.top, Math.exp(-dy * 0.0015)) });
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [store]);

  // ---- underlay alignment: image point, panel point, twice ---------------------------------------
  const alignClick = (w: { x: number; y: number }) => {
    const u = underlayRef.current;
    if (!u) return;
    const e = extrasRef.current;
    if (e.alignImage.length === e.alignPanel.length) {
      const inv = invertAffine(u.transform);
      e.alignImage.push(applyAffine(inv, w.x, w.y));
      setAlignStep(`Now click where image point ${e.alignImage.length} belongs on the panel.`);
    } else {
      e.alignPanel.push(w);
      if (e.alignPanel.length >= 2) {
        try {
          const f = fitUnderlay(e.alignImage, e.alignPanel);
          onUnderlayChange?.({ ...u, transform: f.transform, pairs: { image: [...e.alignImage], panel: [...e.alignPanel] } });
          setAlignError(null);
          setAlignStep(`Aligned: ${(f.scale * 1000).toFixed(3)} µm per pixel, turned ${signedTurn(f.rotationDeg)}°.`);
        } catch (err) {
          setAlignError((err as Error).message);
          setAlignStep(null);
        }
        e.alignImage = [];
        e.alignPanel = [];
        store.setTool('select');
      } else {
        setAlignStep('Click a second point on the image, far from the first.');
      }
    }
    schedule(DIRTY_OVERLAY);
  };
  const tool = useCanvasState(store, (s) => s.tool);
  useEffect(() => {
    if (tool === 'align') {
      setAlignError(null);
      setAlignStep('Click a recognisable point on the image (a corner, a fiducial).');
    } else if (alignStep && !alignStep.startsWith('Aligned')) setAlignStep(null);
    if (tool !== 'note') {
      extrasRef.current.pendingNote = null;
      setPendingNote(null);
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [tool]);

  return { drag, pendingNote, setPendingNote, alignStep, alignError, hoverXY, tool, onPointerDown, onPointerMove, onPointerUp, onPointerLeave };
}
