// Preparation of a check: per-part derived arrays (direction, half sizes, grown boxes, sides),
// the outlines for containment tests, and the static spatial index of one side.
import Flatbush from 'flatbush';
import { cosSinDeg, makeCcw, quadEdges } from './geom';
import { scratchF64 } from './scratch';
import type { VerifyInput } from './types';
import { validateInput } from './validate';

/** Per-part derived arrays shared by the indexed and the brute-force runs. */
export interface Prepared {
  n: number;
  cx: Float64Array;
  cy: Float64Array;
  /** unit direction of the body length */
  c: Float64Array;
  s: Float64Array;
  /** half length, half width */
  hx: Float64Array;
  hy: Float64Array;
  /** courtyard excess */
  g: Float64Array;
  h: Float64Array;
  /** nozzle holder radius */
  R: Float64Array;
  /** half extents of the bounding box of the body grown by its courtyard */
  gex: Float64Array;
  gey: Float64Array;
  /** placement indices per side (0 top, 1 bottom), ascending */
  sideIds: [Int32Array, Int32Array];
}

/** Outlines prepared for containment tests. */
export interface PreparedOutlines {
  /** board outlines, counter-clockwise (8 numbers each) */
  boardCorners: Float64Array;
  /** inward edge normals of each board outline (16 numbers each, see quadEdges) */
  boardEdges: Float64Array;
  /** board outline indices by side and board number */
  boardBySide: [Map<number, number>, Map<number, number>];
  panelCorners: Float64Array;
  panelEdges: Float64Array;
  /** panel outline index by side (-1 when none) */
  panelBySide: [number, number];
}

// ---------------------------------------------------------------------------------------------
// Preparation

export function prepare(input: VerifyInput): Prepared {
  const n = input.count;
  const c = scratchF64('c', n);
  const s = scratchF64('s', n);
  const hx = scratchF64('hx', n);
  const hy = scratchF64('hy', n);
  const gex = scratchF64('gex', n);
  const gey = scratchF64('gey', n);
  const cs = new Float64Array(2);
  const { angleDeg, length, width, courtyard, side, cx, cy, height, holderRadius } = input;
  let top = 0;
  // x − x is 0 for every finite x and NaN for NaN or ±Infinity: one sum tells whether a bad
  // number is anywhere (then validateInput names it)
  let bad = 0;
  let low = 0;
  for (let i = 0; i < n; i++) {
    const a = angleDeg[i];
    const L = length[i];
    const W = width[i];
    const g = courtyard[i];
    const H = height[i];
    const r = holderRadius[i];
    bad += a - a + (L - L) + (W - W) + (g - g) + (H - H) + (r - r) + (cx[i] - cx[i]) + (cy[i] - cy[i]);
    low = Math.min(low, L, W, g, H, r);
    cosSinDeg(a - a === 0 ? a : 0, cs, 0);
    const ci = cs[0];
    const si = cs[1];
    c[i] = ci;
    s[i] = si;
    const x = L / 2;
    const y = W / 2;
    hx[i] = x;
    hy[i] = y;
    const ac = Math.abs(ci);
    const as = Math.abs(si);
    const grow = g * (ac + as);
    gex[i] = ac * x + as * y + grow;
    gey[i] = as * x + ac * y + grow;
    if (side[i] === 0) top++;
  }
  if (bad !== 0 || low < 0) validateInput(input);
  const topIds = new Int32Array(top);
  const bottomIds = new Int32Array(n - top);
  for (let i = 0, t = 0, b = 0; i < n; i++) {
    if (side[i] === 0) topIds[t++] = i;
    else bottomIds[b++] = i;
  }
  return {
    n,
    cx,
    cy,
    c,
    s,
    hx,
    hy,
    g: courtyard,
    h: height,
    R: holderRadius,
    gex,
    gey,
    sideIds: [topIds, bottomIds],
  };
}

export function prepareOutlines(input: VerifyInput): PreparedOutlines {
  const nb = input.boards.length;
  const boardCorners = new Float64Array(8 * nb);
  const boardEdges = new Float64Array(16 * nb);
  const boardBySide: [Map<number, number>, Map<number, number>] = [new Map(), new Map()];
  input.boards.forEach((b, k) => {
    const q = boardCorners.subarray(8 * k, 8 * k + 8);
    q.set(b.corners);
    makeCcw(q, 4);
    quadEdges(q, boardEdges, 16 * k);
    const m = boardBySide[b.side === 'bottom' ? 1 : 0];
    if (!m.has(b.board)) m.set(b.board, k);
  });
  const np = input.panels.length;
  const panelCorners = new Float64Array(8 * np);
  const panelEdges = new Float64Array(16 * np);
  const panelBySide: [number, number] = [-1, -1];
  input.panels.forEach((p, k) => {
    const q = panelCorners.subarray(8 * k, 8 * k + 8);
    q.set(p.corners);
    makeCcw(q, 4);
    quadEdges(q, panelEdges, 16 * k);
    const sd = p.side === 'bottom' ? 1 : 0;
    if (panelBySide[sd] < 0) panelBySide[sd] = k;
  });
  return { boardCorners, boardEdges, boardBySide, panelCorners, panelEdges, panelBySide };
}

/** The static index of one side: item k is placement ids[k], its box the body grown by its own
 * courtyard. Null when the side has no parts. */
export function buildTree(P: Prepared, ids: Int32Array, nodeSize = NODE_SIZE): Flatbush | null {
  const m = ids.length;
  if (m === 0) return null;
  const { cx, cy, gex, gey } = P;
  const tree = new Flatbush(m, nodeSize);
  for (let k = 0; k < m; k++) {
    const i = ids[k];
    const x = cx[i];
    const y = cy[i];
    const ex = gex[i];
    const ey = gey[i];
    tree.add(x - ex, y - ey, x + ex, y + ey);
  }
  tree.finish();
  return tree;
}

export const NODE_SIZE = 16;
