// Frame scheduling for the canvas: a change marks layers dirty, and one animation frame redraws
// each dirty Konva layer once, however many changes came before it.
import type Konva from 'konva';
import { useCallback, useEffect, useRef, type RefObject } from 'react';

export const DIRTY_UNDERLAY = 1, DIRTY_BASE = 2, DIRTY_BODIES = 4, DIRTY_OVERLAY = 8, DIRTY_ALL = 15;

export interface CanvasLayerRefs {
  underlay: RefObject<Konva.Layer | null>;
  base: RefObject<Konva.Layer | null>;
  bodies: RefObject<Konva.Layer | null>;
  overlay: RefObject<Konva.Layer | null>;
}

export interface DrawStats {
  /** which layers were drawn */
  layers: string[];
  /** time spent drawing them, ms */
  ms: number;
}

/**
 * `schedule(mask)` redraws the layers in `mask` on the next frame; `idleTimer` holds the timer of
 * the sharp redraw after the view stops, cleared with the pending frame on unmount.
 */
export function useFrameScheduler(layerRefs: CanvasLayerRefs, onDraw: ((stats: DrawStats) => void) | undefined) {
  const dirty = useRef(0);
  const frame = useRef(0);
  const onDrawRef = useRef(onDraw);
  onDrawRef.current = onDraw;

  const flush = useCallback(() => {
    frame.current = 0;
    const d = dirty.current;
    dirty.current = 0;
    const t0 = performance.now();
    const drawn: string[] = [];
    if (d & DIRTY_UNDERLAY && layerRefs.underlay.current) { layerRefs.underlay.current.draw(); drawn.push('underlay'); }
    if (d & DIRTY_BASE && layerRefs.base.current) { layerRefs.base.current.draw(); drawn.push('base'); }
    if (d & DIRTY_BODIES && layerRefs.bodies.current) { layerRefs.bodies.current.draw(); drawn.push('bodies'); }
    if (d & DIRTY_OVERLAY && layerRefs.overlay.current) { layerRefs.overlay.current.draw(); drawn.push('overlay'); }
    onDrawRef.current?.({ layers: drawn, ms: performance.now() - t0 });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
  const schedule = useCallback(
    (mask: number) => {
      dirty.current |= mask;
      if (!frame.current) frame.current = requestAnimationFrame(flush);
    },
    [flush],
  );
  const idleTimer = useRef(0);
  // On unmount the pending frame is cancelled and forgotten: React's StrictMode (development
  // builds) unmounts and mounts again at once, and a stale frame id here would make `schedule`
  // believe a frame is still coming, so the canvas would never draw again.
  useEffect(() => () => {
    cancelAnimationFrame(frame.current);
    frame.current = 0;
    clearTimeout(idleTimer.current);
    idleTimer.current = 0;
  }, []);
  return { schedule, idleTimer };
}
