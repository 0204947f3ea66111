// The checks of one part or one outline at a time: fiducial clear circles, off-board, reach,
// missing package or nozzle, nozzle size, and the panel layout.
import type Flatbush from 'flatbush';
import { TOUCH_EPS, TOUCH_EPS_AREA, convexIntersectionArea, convexSatDepth, pointRectDistance, pointsOutsideQuad, rectOutsideQuad } from './geom';
import type { Prepared, PreparedOutlines } from './prepare';
import {
  FindingSink,
  K_BOARD_OVERLAP,
  K_FIDUCIAL,
  K_NO_NOZZLE,
  K_NO_PACKAGE,
  K_NOZZLE_SIZE,
  K_OFF_BOARD,
  K_OFF_PANEL,
  K_OVERHANG,
  K_PANEL_REACH,
  K_REACH,
} from './sink';
import { SIDE_NAMES, type SideName, type VerifyInput } from './types';

// ---------------------------------------------------------------------------------------------
// Fiducial clear circles

export function fiducialChecks(
  input: VerifyInput, P: Prepared, ids: Int32Array, side: number, tree: Flatbush | null, sink: FindingSink,
): void {
  const name = SIDE_NAMES[side];
  const fids = input.fiducials;
  if (fids.length === 0 || ids.length === 0) return;
  const { cx, cy, c, s, hx, hy } = P;
  // one finding per placement: the deepest circle it enters
  const slotOf = new Map<number, number>();
  let fk = 0;
  let fx = 0;
  let fy = 0;
  let fr = 0;
  const test = (i: number): void => {
    const dist = pointRectDistance(fx, fy, cx[i], cy[i], c[i], s[i], hx[i], hy[i]);
    const depth = fr - dist;
    if (depth <= TOUCH_EPS) return;
    const slot = slotOf.get(i);
    if (slot === undefined) {
      slotOf.set(i, sink.add(K_FIDUCIAL, i, 0, fk, depth, dist));
    } else if (slot >= 0 && depth > sink.depth[slot]) {
      sink.aux[slot] = fk;
      sink.depth[slot] = depth;
      sink.dist[slot] = dist;
    }
  };
  const visit = (k: number): boolean => {
    test(ids[k]);
    return false;
  };
  for (fk = 0; fk < fids.length; fk++) {
    const f = fids[fk];
    if (f.side !== name || f.clearRadius <= 0) continue;
    fx = f.x;
    fy = f.y;
    fr = f.clearRadius;
    if (tree) tree.search(fx - fr, fy - fr, fx + fr, fy + fr, visit);
    else for (let k = 0; k < ids.length; k++) test(ids[k]);
  }
}

// ---------------------------------------------------------------------------------------------
// Single-part kinds: off-board, out-of-reach, no-package, no-nozzle, nozzle-size

export function singleChecks(
  input: VerifyInput, P: Prepared, O: PreparedOutlines, ids: Int32Array, side: number, sink: FindingSink,
): void {
  const { cx, cy, c, s, hx, hy } = P;
  const { hasPackage, hasNozzle, overhang, board, length, width } = input;
  const tip = input.tipOuter;
  const boardOf = O.boardBySide[side];
  const edges = O.boardEdges;
  const reach = input.reach;
  const rx = reach ? reach.x : 0;
  const ry = reach ? reach.y : 0;
  let lastBoard = -1;
  let lastIdx = -1;
  for (let k = 0; k < ids.length; k++) {
    const i = ids[k];
    if (hasPackage[i] === 0) sink.add(K_NO_PACKAGE, i, 0, 0, NaN, NaN);
    else if (hasNozzle[i] === 0) sink.add(K_NO_NOZZLE, i, 0, 0, NaN, NaN);
    else if (tip !== undefined) {
      // Common practice: a nozzle tip no wider than the body's smaller side, so the tip seals on
      // the body and does not rest on the neighbours or the leads.
      const excess = tip[i] - (length[i] < width[i] ? length[i] : width[i]);
      if (excess > TOUCH_EPS) sink.add(K_NOZZLE_SIZE, i, 0, 0, excess, NaN);
    }
    const x = cx[i];
    const y = cy[i];
    if (reach) {
      let out = -x;
      if (x - rx > out) out = x - rx;
      if (-y > out) out = -y;
      if (y - ry > out) out = y - ry;
      if (out > TOUCH_EPS) sink.add(K_REACH, i, 0, 0, out, NaN);
    }
    const b = board[i];
    if (b !== lastBoard) {
      lastBoard = b;
      const idx = boardOf.get(b);
      lastIdx = idx === undefined ? -1 : idx;
    }
    if (lastIdx >= 0) {
      const out = rectOutsideQuad(edges, 16 * lastIdx, x, y, c[i], s[i], hx[i], hy[i]);
      if (out > TOUCH_EPS) sink.add(overhang[i] ? K_OVERHANG : K_OFF_BOARD, i, lastIdx, 0, out, NaN);
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Panel layout: board overlap, off-panel, panel out of reach

export function panelChecks(input: VerifyInput, O: PreparedOutlines, side: number, sink: FindingSink): void {
  const name: SideName = SIDE_NAMES[side];
  const idx: number[] = [];
  input.boards.forEach((b, k) => {
    if (b.side === name) idx.push(k);
  });
  const bc = O.boardCorners;
  // bounding boxes first, then the exact convex test
  const box = new Float64Array(4 * idx.length);
  idx.forEach((k, t) => {
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
    for (let p = 0; p < 4; p++) {
      const x = bc[8 * k + 2 * p];
      const y = bc[8 * k + 2 * p + 1];
      if (x < x0) x0 = x;
      if (x > x1) x1 = x;
      if (y < y0) y0 = y;
      if (y > y1) y1 = y;
    }
    box.set([x0, y0, x1, y1], 4 * t);
  });
  for (let a = 0; a < idx.length; a++) {
    const qa = bc.subarray(8 * idx[a], 8 * idx[a] + 8);
    for (let b = a + 1; b < idx.length; b++) {
      if (box[4 * b] >= box[4 * a + 2] || box[4 * b + 2] <= box[4 * a] ||
          box[4 * b + 1] >= box[4 * a + 3] || box[4 * b + 3] <= box[4 * a + 1]) continue;
      const qb = bc.subarray(8 * idx[b], 8 * idx[b] + 8);
      const depth = convexSatDepth(qa, 4, qb, 4);
      if (depth > TOUCH_EPS && convexIntersectionArea(qa, 4, qb, 4) > TOUCH_EPS_AREA) {
        sink.add(K_BOARD_OVERLAP, idx[a], idx[b], side, depth, NaN);
      }
    }
  }
  const p = O.panelBySide[side];
  if (p >= 0) {
    for (const k of idx) {
      const out = pointsOutsideQuad(O.panelEdges, 16 * p, bc.subarray(8 * k, 8 * k + 8), 4);
      if (out > TOUCH_EPS) sink.add(K_OFF_PANEL, k, p, side, out, NaN);
    }
    if (input.reach) {
      const { x: rx, y: ry } = input.reach;
      let out = -Infinity;
      for (let q = 0; q < 4; q++) {
        const x = O.panelCorners[8 * p + 2 * q];
        const y = O.panelCorners[8 * p + 2 * q + 1];
        out = Math.max(out, -x, x - rx, -y, y - ry);
      }
      if (out > TOUCH_EPS) sink.add(K_PANEL_REACH, p, 0, side, out, NaN);
    }
  }
}
