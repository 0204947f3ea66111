// The overlay layer, redrawn on every change: selected findings, reference labels, selection and
// hover, the measure, comment pins, underlay alignment points and the box being dragged. Text is
// drawn in screen space, upright.
import { CANVAS_COLORS as C } from './palette';
import type { Scene } from './scene';
import type { LayerVisibility, MeasurePoint } from './store';
import { fixed } from '../../lib/format';
import { bodiesOnScreen, worldOn, type CanvasNote, type Viewport } from './draw-common';

export interface OverlayState {
  layers: LayerVisibility;
  selected: ReadonlySet<number>;
  selectedFindings: ReadonlySet<string>;
  hovered: number;
  measure: readonly MeasurePoint[];
  notes: readonly CanvasNote[];
  dim: Uint8Array | null;
  alignImage: readonly { x: number; y: number }[];
  alignPanel: readonly { x: number; y: number }[];
  /** box select in screen px */
  box: { x0: number; y0: number; x1: number; y1: number } | null;
  /** a note being written (screen marker) */
  pendingNote: { x: number; y: number } | null;
}

const LABEL_MIN_PX = 8;
const LABEL_MAX_PX = 14;
const LABEL_CAP = 1500;

/** Findings, reference labels, selection and hover, measure, notes, alignment points, box. */
export function drawOverlay(ctx: CanvasRenderingContext2D, scene: Scene, vp: Viewport, st: OverlayState) {
  const v = vp.view;
  const px = 1 / v.s;
  const p = scene.run.placements;
  const S = (x: number, y: number) => [v.ox + v.s * x, v.oy - v.s * y] as const;

  // ---- selected findings: a white outline over their geometry ---------------------------------
  if (st.selectedFindings.size && st.layers.findings) {
    worldOn(ctx, v);
    ctx.strokeStyle = C.selection;
    ctx.lineWidth = 2 * px;
    for (const f of scene.findings) {
      if (!st.selectedFindings.has(f.key)) continue;
      const g = f.geometry;
      ctx.beginPath();
      if (g.type === 'polygon') {
        ctx.moveTo(g.points[0][0], g.points[0][1]);
        for (let j = 1; j < g.points.length; j++) ctx.lineTo(g.points[j][0], g.points[j][1]);
        ctx.closePath();
      } else if (g.type === 'segment') {
        ctx.moveTo(g.from[0], g.from[1]);
        ctx.lineTo(g.to[0], g.to[1]);
      } else {
        ctx.arc(g.x, g.y, 10 * px, 0, 2 * Math.PI);
      }
      ctx.stroke();
    }
    ctx.restore();
  }

  // ---- reference labels (only when a label fits on its body) --------------------------------
  if (st.layers.labels && p.count) {
    const list = bodiesOnScreen(scene, vp);
    const count = list ? list.length : p.count;
    // quick exit: even the largest body would be too small for a label
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    ctx.lineJoin = 'round';
    let drawn = 0;
    let lastFont = 0;
    for (let j = 0; j < count && drawn < LABEL_CAP; j++) {
      const i = list ? list[j] : j;
      const L = p.bodyLength[i], W = p.bodyWidth[i];
      const minSide = L > 0 && W > 0 ? Math.min(L, W) : 0.5;
      const size = Math.min(LABEL_MAX_PX, minSide * v.s * 0.8);
      if (size < LABEL_MIN_PX) continue;
      const ref = p.ref[i];
      const longSide = L > 0 && W > 0 ? Math.max(L, W) : 0.5;
      const f = Math.round(size);
      if (f !== lastFont) {
        ctx.font = `500 ${f}px "Roboto Mono", ui-monospace, monospace`;
        lastFont = f;
      }
      // a label wider than the body's long side plus a little is unreadable among neighbours
      if (ref.length * f * 0.6 > longSide * v.s * 1.25) continue;
      const [sx, sy] = S(p.x[i], p.y[i]);
      ctx.globalAlpha = st.dim && st.dim[i] ? 0.35 : 1;
      ctx.lineWidth = 3;
      ctx.strokeStyle = C.labelHalo;
      ctx.strokeText(ref, sx, sy);
      ctx.fillStyle = C.label;
      ctx.fillText(ref, sx, sy);
      drawn++;
    }
    ctx.globalAlpha = 1;
  }

  // ---- selection and hover ------------------------------------------------------------------
  const ring = (i: number, color: string, width: number) => {
    worldOn(ctx, v);
    ctx.beginPath();
    const k = 8 * i;
    const q = scene.quads;
    ctx.moveTo(q[k], q[k + 1]);
    for (let j = 2; j < 8; j += 2) ctx.lineTo(q[k + j], q[k + j + 1]);
    ctx.closePath();
    ctx.lineWidth = width * px;
    ctx.strokeStyle = color;
    ctx.stroke();
    ctx.restore();
    // a ring in screen space keeps a tiny part visible when zoomed out
    const b = scene.boxes;
    const size = Math.max(b[4 * i + 2] - b[4 * i], b[4 * i + 3] - b[4 * i + 1]) * v.s;
    if (size < 10) {
      const [sx, sy] = S(p.x[i], p.y[i]);
      ctx.beginPath();
      ctx.arc(sx, sy, 8, 0, 2 * Math.PI);
      ctx.lineWidth = 1.5;
      ctx.strokeStyle = color;
      ctx.stroke();
    }
  };
  for (const i of st.selected) if (i < p.count) ring(i, C.selection, 2.5);
  if (st.hovered >= 0 && st.hovered < p.count) ring(st.hovered, C.hover, 1.5);

  // ---- measure --------------------------------------------------------------------------------
  if (st.measure.length) {
    ctx.strokeStyle = C.measure;
    ctx.fillStyle = C.measure;
    const pts = st.measure.map((m) => S(m.x, m.y));
    ctx.beginPath();
    for (const [sx, sy] of pts) {
      ctx.moveTo(sx + 4, sy);
      ctx.arc(sx, sy, 4, 0, 2 * Math.PI);
    }
    ctx.fill();
    if (pts.length === 2) {
      ctx.beginPath();
      ctx.moveTo(pts[0][0], pts[0][1]);
      ctx.lineTo(pts[1][0], pts[1][1]);
      ctx.lineWidth = 2;
      ctx.setLineDash([6, 4]);
      ctx.stroke();
      ctx.setLineDash([]);
      const d = Math.hypot(st.measure[1].x - st.measure[0].x, st.measure[1].y - st.measure[0].y);
      const mx = (pts[0][0] + pts[1][0]) / 2, my = (pts[0][1] + pts[1][1]) / 2;
      ctx.font = '500 12px "Roboto Mono", ui-monospace, monospace';
      ctx.textAlign = 'center';
      ctx.textBaseline = 'bottom';
      ctx.lineWidth = 4;
      ctx.strokeStyle = C.labelHalo;
      const t = `${fixed(d)} mm`;
      ctx.strokeText(t, mx, my - 6);
      ctx.fillText(t, mx, my - 6);
    }
  }

  // ---- notes ------------------------------------------------------------------------------------
  const pin = (sx: number, sy: number, label: string, color: string) => {
    ctx.beginPath();
    ctx.moveTo(sx, sy);
    ctx.lineTo(sx - 6, sy - 12);
    ctx.arc(sx, sy - 16, 7, Math.PI * 0.8, Math.PI * 0.2);
    ctx.closePath();
    ctx.fillStyle = color;
    ctx.fill();
    ctx.font = '600 10px Inter, system-ui, sans-serif';
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    ctx.fillStyle = C.labelHalo;
    ctx.fillText(label, sx, sy - 16);
  };
  st.notes.forEach((nt, k) => {
    if (nt.side !== scene.run.side) return;
    const [sx, sy] = S(nt.x, nt.y);
    pin(sx, sy, String(k + 1), C.note);
  });
  if (st.pendingNote) {
    const [sx, sy] = S(st.pendingNote.x, st.pendingNote.y);
    pin(sx, sy, '+', C.hover);
  }

  // ---- underlay alignment points -----------------------------------------------------------------
  const cross = (x: number, y: number, color: string, label: string) => {
    const [sx, sy] = S(x, y);
    ctx.beginPath();
    ctx.moveTo(sx - 8, sy); ctx.lineTo(sx + 8, sy);
    ctx.moveTo(sx, sy - 8); ctx.lineTo(sx, sy + 8);
    ctx.lineWidth = 2;
    ctx.strokeStyle = color;
    ctx.stroke();
    ctx.font = '600 11px Inter, system-ui, sans-serif';
    ctx.textAlign = 'left';
    ctx.textBaseline = 'bottom';
    ctx.fillStyle = color;
    ctx.fillText(label, sx + 5, sy - 4);
  };
  st.alignImage.forEach((q, k) => cross(q.x, q.y, C.alignImage, `image ${k + 1}`));
  st.alignPanel.forEach((q, k) => cross(q.x, q.y, C.alignPanel, `panel ${k + 1}`));

  if (st.box) {
    const { x0, y0, x1, y1 } = st.box;
    ctx.beginPath();
    ctx.rect(Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0));
    ctx.fillStyle = 'rgba(231, 164, 108, 0.12)';
    ctx.fill();
    ctx.lineWidth = 1;
    ctx.strokeStyle = C.boxSelect;
    ctx.setLineDash([4, 3]);
    ctx.stroke();
    ctx.setLineDash([]);
  }
}
