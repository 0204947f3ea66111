// Drawing of the canvas layers on a plain 2-D context, in batches: one path per colour for all
// bodies, one for all courtyards, one for all pin-1 marks. Culling through the body index. World
// drawing runs under the view transform (Y up); text is drawn in screen space, upright.
// This file draws the underlay and the base (panel, reach, boards, fiducials); the bodies, the
// findings and the overlay have a file each, re-exported here.
import type { Affine } from '../../../shared/geometry';
import { CANVAS_COLORS as C } from './palette';
import type { Scene } from './scene';
import type { LayerVisibility } from './store';
import { outlinePath, worldOn, type Viewport } from './draw-common';

export { bodiesOnScreen, type CanvasNote, type Viewport } from './draw-common';
export { drawBodies } from './draw-bodies';
export { drawFindings, type FindingStyle } from './draw-findings';
export { drawOverlay, type OverlayState } from './draw-overlay';

/** Panel edge, machine reach, boards (numbers, skipped ones crossed), fiducials. */
export function drawBase(ctx: CanvasRenderingContext2D, scene: Scene, vp: Viewport, layers: LayerVisibility, underlayShown = false) {
  const { view: v } = vp;
  const run = scene.run;
  const px = 1 / v.s;
  worldOn(ctx, v);
  if (layers.panel) {
    ctx.beginPath();
    outlinePath(ctx, run.panel.outline);
    if (!underlayShown) {
      // the panel's own fill would hide an underlay image drawn below it
      ctx.fillStyle = C.panelFill;
      ctx.fill();
    }
    ctx.lineWidth = 1.5 * px;
    ctx.strokeStyle = C.panelEdge;
    ctx.stroke();
  }
  if (layers.reach && run.machine) {
    ctx.beginPath();
    ctx.rect(0, 0, run.machine.reachX, run.machine.reachY);
    ctx.setLineDash([8 * px, 5 * px]);
    ctx.lineWidth = 1.25 * px;
    ctx.strokeStyle = C.reach;
    ctx.stroke();
    ctx.setLineDash([]);
  }
  if (layers.boards) {
    ctx.beginPath();
    for (const b of run.boards) if (!b.skipped) outlinePath(ctx, b.outline);
    if (!underlayShown) {
      ctx.fillStyle = C.boardFill;
      ctx.fill();
    }
    ctx.lineWidth = 1 * px;
    ctx.strokeStyle = C.boardEdge;
    ctx.stroke();
    ctx.beginPath();
    for (const b of run.boards) {
      if (!b.skipped) continue;
      outlinePath(ctx, b.outline);
      const o = b.outline;
      ctx.moveTo(o[0].x, o[0].y); ctx.lineTo(o[2].x, o[2].y);
      ctx.moveTo(o[1].x, o[1].y); ctx.lineTo(o[3].x, o[3].y);
    }
    ctx.strokeStyle = C.boardSkipped;
    ctx.stroke();
  }
  if (layers.fiducials && run.fiducials.length) {
    ctx.beginPath();
    for (const f of run.fiducials) {
      ctx.moveTo(f.x + f.clearRadius, f.y);
      ctx.arc(f.x, f.y, f.clearRadius, 0, 2 * Math.PI);
    }
    ctx.setLineDash([3 * px, 3 * px]);
    ctx.lineWidth = 1 * px;
    ctx.strokeStyle = C.fiducialClear;
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.beginPath();
    // the copper dot: 1.0 mm across (common practice), at least 3 px
    const r = Math.max(0.5, 1.5 * px);
    for (const f of run.fiducials) {
      ctx.moveTo(f.x + r, f.y);
      ctx.arc(f.x, f.y, r, 0, 2 * Math.PI);
    }
    ctx.fillStyle = C.fiducial;
    ctx.fill();
  }
  ctx.restore();

  // board numbers, upright in screen space
  if (layers.boards) {
    const size = Math.max(11, Math.min(28, v.s * 4));
    ctx.font = `600 ${size}px Inter, system-ui, sans-serif`;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    for (const b of run.boards) {
      const o = b.outline;
      const cx = (o[0].x + o[2].x) / 2, cy = (o[0].y + o[2].y) / 2;
      const sx = v.ox + v.s * cx, sy = v.oy - v.s * cy;
      if (sx < -50 || sy < -50 || sx > vp.width + 50 || sy > vp.height + 50) continue;
      ctx.fillStyle = b.skipped ? C.boardSkipped : C.boardText;
      ctx.globalAlpha = 0.55;
      ctx.fillText(b.skipped ? `${b.number} skipped` : String(b.number), sx, sy);
      ctx.globalAlpha = 1;
    }
  }
  if (layers.fiducials && v.s >= 3) {
    ctx.font = '11px "Roboto Mono", ui-monospace, monospace';
    ctx.textAlign = 'left';
    ctx.textBaseline = 'bottom';
    ctx.fillStyle = C.fiducial;
    for (const f of run.fiducials) {
      const sx = v.ox + v.s * (f.x + f.clearRadius), sy = v.oy - v.s * (f.y + f.clearRadius);
      ctx.fillText(f.name, sx + 2, sy);
    }
  }
}

/** The underlay image under its image-pixel → output-frame transform. */
export function drawUnderlay(ctx: CanvasRenderingContext2D, vp: Viewport, img: CanvasImageSource, t: Affine, opacity: number) {
  worldOn(ctx, vp.view);
  ctx.transform(t.a, t.c, t.b, t.d, t.tx, t.ty);
  ctx.globalAlpha = opacity;
  ctx.drawImage(img, 0, 0);
  ctx.globalAlpha = 1;
  ctx.restore();
}
