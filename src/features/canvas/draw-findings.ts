// The findings layer: each finding's geometry in its severity's colour, grouped by style and drawn
// in batched paths.
import { visibleWorldBox } from '../../../shared/canvas';
import type { Finding } from '../../../shared/schemas/finding.schema';
import { SEVERITY_COLORS } from './palette';
import type { Scene } from './scene';
import { BATCH, meets, worldOn, type Viewport } from './draw-common';

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
