// Help for the Panelize stage: a sensible grid pitch, boards that overlap or leave the panel as the
// user types, and a board outline from the parts' extent. Geometry through shared/panel, the same
// step-out the engine uses.
import { applyAffine } from '../../../../../shared/geometry';
import { boardInstances, instanceAffine } from '../../../../../shared/panel';
import { panelSchema } from '../../../../../shared/schemas/job.schema';

/**
 * Gap between neighbouring boards in a new grid, mm. A routed panel leaves a channel for the
 * router bit between boards; 2 mm suits the common 2 mm bit (common practice, from memory). For
 * V-scored panels set the pitch to the board size itself.
 */
export const BOARD_GAP_MM = 2;

/**
 * Margin around the parts' centres when the outline is fitted to them, mm: bodies reach past their
 * centres, and parts rarely sit closer than this to the board edge (from memory). A starting
 * point only: the real outline comes from the board's drawing.
 */
export const FIT_MARGIN_MM = 2;

export interface BoardOutline {
  originX: number;
  originY: number;
  width: number;
  height: number;
}

/** The default grid pitch: the board's size plus the gap (0 while the size is unknown). */
export function defaultPitch(board: Partial<BoardOutline> | null | undefined): { pitchX: number; pitchY: number } {
  const w = board?.width, h = board?.height;
  return { pitchX: w && w > 0 ? round3(w + BOARD_GAP_MM) : 0, pitchY: h && h > 0 ? round3(h + BOARD_GAP_MM) : 0 };
}

/** The board outline around the parts' centres, grown by `margin` on every side. */
export function outlineFromExtent(e: { minX: number; minY: number; maxX: number; maxY: number }, margin = FIT_MARGIN_MM): BoardOutline {
  return { originX: round3(e.minX - margin), originY: round3(e.minY - margin), width: round3(e.maxX - e.minX + 2 * margin), height: round3(e.maxY - e.minY + 2 * margin) };
}

type Pt = { x: number; y: number };

/** Do two convex polygons overlap with positive area (touching edges do not count)? Separating axes. */
function convexOverlap(a: Pt[], b: Pt[], eps = 1e-6): boolean {
  for (const poly of [a, b]) {
    for (let i = 0; i < poly.length; i++) {
      const p = poly[i], q = poly[(i + 1) % poly.length];
      const nx = q.y - p.y, ny = p.x - q.x;
      const len = Math.hypot(nx, ny) || 1;
      let aMin = Infinity, aMax = -Infinity, bMin = Infinity, bMax = -Infinity;
      for (const v of a) { const d = (v.x * nx + v.y * ny) / len; aMin = Math.min(aMin, d); aMax = Math.max(aMax, d); }
      for (const v of b) { const d = (v.x * nx + v.y * ny) / len; bMin = Math.min(bMin, d); bMax = Math.max(bMax, d); }
      if (aMax <= bMin + eps || bMax <= aMin + eps) return false; // a separating axis: apart (or touching)
    }
  }
  return true;
}

export interface PanelProblems {
  /** pairs of board numbers whose outlines overlap */
  overlaps: [number, number][];
  /** boards that reach outside the panel outline */
  offPanel: number[];
}

/** Overlapping boards and boards off the panel, for the settings as typed (skipped boards count too: they are on the panel). */
export function panelProblems(board: Partial<BoardOutline> | null | undefined, panel: unknown): PanelProblems | null {
  const parsed = panelSchema.safeParse(panel);
  const W = board?.width, H = board?.height;
  if (!parsed.success || !W || !H || !(W > 0) || !(H > 0)) return null;
  let instances;
  try {
    instances = boardInstances(parsed.data);
  } catch {
    return null;
  }
  if (instances.length > 400) return null; // a very large panel: the checks report it
  const outlines = instances.map((inst) => {
    const m = instanceAffine(inst, W, H);
    return { n: inst.number, pts: [applyAffine(m, 0, 0), applyAffine(m, W, 0), applyAffine(m, W, H), applyAffine(m, 0, H)] };
  });
  const overlaps: [number, number][] = [];
  for (let i = 0; i < outlines.length; i++) {
    for (let j = i + 1; j < outlines.length; j++) if (convexOverlap(outlines[i].pts, outlines[j].pts)) overlaps.push([outlines[i].n, outlines[j].n]);
  }
  const pw = parsed.data.width, ph = parsed.data.height;
  const eps = 1e-6;
  const offPanel = pw > 0 && ph > 0 ? outlines.filter((o) => o.pts.some((p) => p.x < -eps || p.y < -eps || p.x > pw + eps || p.y > ph + eps)).map((o) => o.n) : [];
  return { overlaps, offPanel };
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;
