// Hit testing for the canvas: a flatbush index over the bodies' bounding boxes, then an exact
// point-in-turned-rectangle test on the few candidates. Queries return placement indices.
import Flatbush from 'flatbush';
import type { Box } from '../geometry';

export interface BodyIndex {
  index: Flatbush | null;
  quads: Float64Array;
  boxes: Float64Array;
  count: number;
}

/** Build the index once per run from bodyQuads() and quadBoxes(). */
export function buildBodyIndex(quads: Float64Array, boxes: Float64Array): BodyIndex {
  const count = boxes.length / 4;
  if (count === 0) return { index: null, quads, boxes, count };
  const index = new Flatbush(count);
  for (let i = 0; i < count; i++) index.add(boxes[4 * i], boxes[4 * i + 1], boxes[4 * i + 2], boxes[4 * i + 3]);
  index.finish();
  return { index, quads, boxes, count };
}

/** Distance from (x, y) to quad i (0 inside). The quads are convex (turned rectangles). */
export function distanceToQuad(quads: Float64Array, i: number, x: number, y: number): number {
  const k = 8 * i;
  let inside = true;
  let best = Infinity;
  // winding: positive area means counter-clockwise
  let area = 0;
  for (let j = 0; j < 4; j++) {
    const x0 = quads[k + 2 * j], y0 = quads[k + 2 * j + 1];
    const x1 = quads[k + ((2 * j + 2) % 8)], y1 = quads[k + ((2 * j + 3) % 8)];
    area += x0 * y1 - x1 * y0;
  }
  const sign = area >= 0 ? 1 : -1;
  for (let j = 0; j < 4; j++) {
    const x0 = quads[k + 2 * j], y0 = quads[k + 2 * j + 1];
    const x1 = quads[k + ((2 * j + 2) % 8)], y1 = quads[k + ((2 * j + 3) % 8)];
    const ex = x1 - x0, ey = y1 - y0;
    const cross = ex * (y - y0) - ey * (x - x0);
    if (cross * sign < 0) inside = false;
    const len2 = ex * ex + ey * ey;
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((x - x0) * ex + (y - y0) * ey) / len2)) : 0;
    const d = Math.hypot(x - (x0 + t * ex), y - (y0 + t * ey));
    if (d < best) best = d;
  }
  return inside ? 0 : best;
}

const quadArea = (q: Float64Array, i: number): number => {
  const k = 8 * i;
  return Math.hypot(q[k + 2] - q[k], q[k + 3] - q[k + 1]) * Math.hypot(q[k + 6] - q[k], q[k + 7] - q[k + 1]);
};

/**
 * The body at (x, y) within `tol` mm: among the bodies that contain the point (or lie within tol),
 * the one with the smallest area (a small part on top of a large one stays pickable); ties by
 * distance, then lower index. -1 when none. `accept` filters candidates (e.g. hidden parts).
 */
export function hitPoint(ix: BodyIndex, x: number, y: number, tol = 0, accept?: (i: number) => boolean): number {
  if (!ix.index) return -1;
  const cand = ix.index.search(x - tol, y - tol, x + tol, y + tol);
  let best = -1, bestD = Infinity, bestA = Infinity;
  for (const i of cand) {
    if (accept && !accept(i)) continue;
    const d = distanceToQuad(ix.quads, i, x, y);
    if (d > tol) continue;
    const a = quadArea(ix.quads, i);
    const dd = d > 0 ? 1 : 0; // containing bodies first
    const bd = bestD > 0 ? 1 : 0;
    if (best < 0 || dd < bd || (dd === bd && (a < bestA - 1e-12 || (Math.abs(a - bestA) <= 1e-12 && (d < bestD || (d === bestD && i < best)))))) {
      best = i; bestD = d; bestA = a;
    }
  }
  return best;
}

/** Bodies whose centre lies inside the box (box select), ascending indices. */
export function hitBox(ix: BodyIndex, box: Box, cx: ArrayLike<number>, cy: ArrayLike<number>, accept?: (i: number) => boolean): number[] {
  if (!ix.index) return [];
  const out = ix.index.search(box.minX, box.minY, box.maxX, box.maxY).filter(
    (i) => cx[i] >= box.minX && cx[i] <= box.maxX && cy[i] >= box.minY && cy[i] <= box.maxY && (!accept || accept(i)),
  );
  return out.sort((a, b) => a - b);
}

/** Indices of bodies whose bounding box meets the box (drawing cull), unsorted. */
export function visibleBodies(ix: BodyIndex, box: Box): number[] {
  return ix.index ? ix.index.search(box.minX, box.minY, box.maxX, box.maxY) : [];
}

/** Brute-force references for tests. */
export function hitPointBrute(ix: BodyIndex, x: number, y: number, tol = 0): number {
  let best = -1, bestD = Infinity, bestA = Infinity;
  for (let i = 0; i < ix.count; i++) {
    const d = distanceToQuad(ix.quads, i, x, y);
    if (d > tol) continue;
    const a = quadArea(ix.quads, i);
    const dd = d > 0 ? 1 : 0;
    const bd = bestD > 0 ? 1 : 0;
    if (best < 0 || dd < bd || (dd === bd && (a < bestA - 1e-12 || (Math.abs(a - bestA) <= 1e-12 && d < bestD)))) {
      best = i; bestD = d; bestA = a;
    }
  }
  return best;
}
