// Drawing of the canvas layers on a plain 2-D context, in batches: one path per colour for all
// bodies, one for all courtyards, one for all pin-1 marks. Culling through the body index. World
// drawing runs under the view transform (Y up); text is drawn in screen space, upright.
import { visibleBodies, visibleWorldBox, type ViewTransform } from '../../../shared/canvas';
import type { Affine, Box } from '../../../shared/geometry';
import type { Finding } from '../../../shared/schemas/finding.schema';
import { CANVAS_COLORS as C, SEVERITY_COLORS } from './palette';
import type { Scene } from './scene';
import type { LayerVisibility, MeasurePoint } from './store';
import { fixed } from '../../lib/format';

export interface Viewport {
  view: ViewTransform;
  width: number;
  height: number;
}

/** A comment pinned at output-frame coordinates of one side. */
export interface CanvasNote {
  id: string;
  side: 'top' | 'bottom';
  x: number;
  y: number;
  text: string;
  author?: string;
  createdAt?: string;
}

/** Shapes per path: small paths keep the rasteriser linear. */
const BATCH = 200;

const contains = (outer: Box, inner: Box) => outer.minX <= inner.minX && outer.minY <= inner.minY && outer.maxX >= inner.maxX && outer.maxY >= inner.maxY;
const meets = (a: Box, b: Box) => a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;

function worldOn(ctx: CanvasRenderingContext2D, v: ViewTransform) {
  ctx.save();
  ctx.transform(v.s, 0, 0, -v.s, v.ox, v.oy);
}

/** Indices of the bodies on screen (all of them, without a search, when the whole panel shows). */
export function bodiesOnScreen(scene: Scene, vp: Viewport): ArrayLike<number> | null {
  const box = visibleWorldBox(vp.view, vp.width, vp.height);
  if (contains(box, scene.bodyBounds)) return null; // null = all
  return visibleBodies(scene.index, box);
}

function quadPath(ctx: CanvasRenderingContext2D, q: Float64Array, i: number) {
  const k = 8 * i;
  ctx.moveTo(q[k], q[k + 1]);
  ctx.lineTo(q[k + 2], q[k + 3]);
  ctx.lineTo(q[k + 4], q[k + 5]);
  ctx.lineTo(q[k + 6], q[k + 7]);
  ctx.closePath();
}

function outlinePath(ctx: CanvasRenderingContext2D, pts: readonly { x: number; y: number }[]) {
  ctx.moveTo(pts[0].x, pts[0].y);
  for (let j = 1; j < pts.length; j++) ctx.lineTo(pts[j].x, pts[j].y);
  ctx.closePath();
}

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


export interface FindingStyle {
  checked: ReadonlySet<string>;
  findingDim: ((f: Finding) => boolean) | null;
}

/** Findings by severity: small areas filled, large ones outlined, points ringed, gaps as lines.
 * Grouped by style (severity × faint × checked) and drawn in batched paths. */
export function drawFindings(ctx: CanvasRenderingContext2D, scene: Scene, vp: Viewport, st: FindingStyle) {
  const v = vp.view;
  const px = 1 / v.s;
  const screen = visibleWorldBox(v, vp.width, vp.height);
  const po = scene.run.panel.outline;
  const panelArea = Math.abs((po[1].x - po[0].x) * (po[3].y - po[0].y) - (po[1].y - po[0].y) * (po[3].x - po[0].x));
  type Group = { color: string; faint: boolean; checked: boolean; filled: Finding[]; outlined: Finding[]; lines: Finding[]; points: Finding[] };
  const groups = new Map<string, Group>();
  scene.findings.forEach((f, k) => {
    const b = scene.findingBoxes[k];
    if (!meets(screen, b)) return;
    const checked = st.checked.has(f.key);
    const faint = checked || (st.findingDim ? st.findingDim(f) : false);
    const key = `${f.severity}${faint ? 1 : 0}${checked ? 1 : 0}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { color: SEVERITY_COLORS[f.severity], faint, checked, filled: [], outlined: [], lines: [], points: [] }));
    const t = f.geometry.type;
    // a small area (an overlap) is filled; a large one (a board or the panel beyond its limit)
    // only outlined, so it does not hide what lies under it
    if (t === 'polygon') ((b.maxX - b.minX) * (b.maxY - b.minY) < panelArea * 0.02 ? g.filled : g.outlined).push(f);
    else if (t === 'segment') g.lines.push(f);
    else g.points.push(f);
  });
  const poly = (f: Finding) => {
    const g = f.geometry as Extract<Finding['geometry'], { type: 'polygon' }>;
    ctx.moveTo(g.points[0][0], g.points[0][1]);
    for (let j = 1; j < g.points.length; j++) ctx.lineTo(g.points[j][0], g.points[j][1]);
    ctx.closePath();
  };
  const batches = (list: Finding[], add: (f: Finding) => void, paint: () => void) => {
    for (let a = 0; a < list.length; a += BATCH) {
      ctx.beginPath();
      for (let j = a; j < Math.min(list.length, a + BATCH); j++) add(list[j]);
      paint();
    }
  };
  worldOn(ctx, v);
  for (const g of groups.values()) {
    ctx.strokeStyle = g.color;
    ctx.fillStyle = g.color;
    ctx.setLineDash(g.checked ? [4 * px, 3 * px] : []);
    const strokeAlpha = g.faint ? 0.35 : 1;
    ctx.lineWidth = 2 * px;
    batches(g.filled, poly, () => {
      ctx.globalAlpha = g.faint ? 0.1 : 0.35;
      ctx.fill();
      ctx.globalAlpha = strokeAlpha;
      ctx.stroke();
    });
    ctx.globalAlpha = strokeAlpha;
    batches(g.outlined, poly, () => ctx.stroke());
    batches(
      g.lines,
      (f) => {
        const s = f.geometry as Extract<Finding['geometry'], { type: 'segment' }>;
        ctx.moveTo(s.from[0], s.from[1]);
        ctx.lineTo(s.to[0], s.to[1]);
      },
      () => ctx.stroke(),
    );
    ctx.lineWidth = 2.5 * px;
    batches(
      g.points,
      (f) => {
        const q = f.geometry as Extract<Finding['geometry'], { type: 'point' }>;
        ctx.moveTo(q.x + 7 * px, q.y);
        ctx.arc(q.x, q.y, 7 * px, 0, 2 * Math.PI);
      },
      () => ctx.stroke(),
    );
  }
  ctx.setLineDash([]);
  ctx.globalAlpha = 1;
  ctx.restore();
}

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

/** The underlay image under its image-pixel → output-frame transform. */
export function drawUnderlay(ctx: CanvasRenderingContext2D, vp: Viewport, img: CanvasImageSource, t: Affine, opacity: number) {
  worldOn(ctx, vp.view);
  ctx.transform(t.a, t.c, t.b, t.d, t.tx, t.ty);
  ctx.globalAlpha = opacity;
  ctx.drawImage(img, 0, 0);
  ctx.globalAlpha = 1;
  ctx.restore();
}
