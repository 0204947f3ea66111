// The bodies layer: courtyards, bodies (dimmed ones apart) and pin-1 marks, one path per batch and
// colour, culled through the body index.
import { CANVAS_COLORS as C } from './palette';
import type { Scene } from './scene';
import type { LayerVisibility } from './store';
import { BATCH, bodiesOnScreen, quadPath, worldOn, type Viewport } from './draw-common';

/** Courtyards, bodies (dimmed ones apart) and pin-1 marks. */
export function drawBodies(ctx: CanvasRenderingContext2D, scene: Scene, vp: Viewport, layers: LayerVisibility, dim: Uint8Array | null) {
  const v = vp.view;
  const px = 1 / v.s;
  const n = scene.run.placements.count;
  if (!n || (!layers.bodies && !layers.courtyards && !layers.marks)) return;
  const list = bodiesOnScreen(scene, vp);
  const count = list ? list.length : n;
  const at = (j: number) => (list ? list[j] : j);
  worldOn(ctx, v);
  if (layers.courtyards) {
    ctx.lineWidth = px;
    ctx.setLineDash([2 * px, 2 * px]);
    ctx.strokeStyle = C.courtyard;
    ctx.beginPath();
    for (let j = 0; j < count; j++) {
      quadPath(ctx, scene.courtyards, at(j));
      if (j % BATCH === BATCH - 1) { ctx.stroke(); ctx.beginPath(); }
    }
    ctx.stroke();
    ctx.setLineDash([]);
  }
  if (layers.bodies) {
    const edges = v.s >= 4; // outlines only when a 1 mm body is 4 px or more
    for (const pass of dim ? [1, 0] : [0]) {
      ctx.fillStyle = pass ? C.bodyDimFill : C.bodyFill;
      ctx.lineWidth = px;
      ctx.strokeStyle = pass ? C.bodyDimEdge : C.bodyEdge;
      // one path per batch of bodies: a single path of 50,000 overlapping rectangles is
      // filled very slowly by the software rasteriser
      let inPath = 0;
      ctx.beginPath();
      for (let j = 0; j < count; j++) {
        const i = at(j);
        if (dim && dim[i] !== pass) continue;
        quadPath(ctx, scene.quads, i);
        if (++inPath === BATCH) {
          ctx.fill();
          if (edges) ctx.stroke();
          ctx.beginPath();
          inPath = 0;
        }
      }
      if (inPath) {
        ctx.fill();
        if (edges) ctx.stroke();
      }
    }
  }
  if (layers.marks && v.s >= 2) {
    ctx.fillStyle = C.mark;
    ctx.beginPath();
    const m = scene.marks;
    const minR = 0.9 * px;
    const minSide = 6 * px; // a mark only on a body at least 6 px across
    const p = scene.run.placements;
    let inPath = 0;
    for (let j = 0; j < count; j++) {
      const i = at(j);
      if (dim && dim[i]) continue;
      if (!(Math.min(p.bodyLength[i], p.bodyWidth[i]) >= minSide)) continue;
      const x = m[3 * i], y = m[3 * i + 1], r = Math.max(m[3 * i + 2], minR);
      ctx.moveTo(x + r, y);
      ctx.arc(x, y, r, 0, 2 * Math.PI);
      if (++inPath === BATCH) { ctx.fill(); ctx.beginPath(); inPath = 0; }
    }
    if (inPath) ctx.fill();
  }
  ctx.restore();
}
