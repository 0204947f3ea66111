// The findings engine (DOMAIN.md section 11, CLI.md "Check"). Pure: no node: imports, no I/O, so
// it runs in a worker thread on the server, in the CLI and in the browser.
//
// Method: per side, a static spatial index (flatbush) over every body's bounding box grown by its
// own courtyard, built in the cell order of a grid bucketing (planQueries). Overlaps: neighbouring
// parts (a bucket of about GROUP_SIZE) share one index query over the union of their grown boxes;
// each pair whose boxes meet is taken up once and gets the exact separating-axis test on the
// turned rectangles (penetration depth, then the common area by convex clipping) for courtyards
// and bodies. Nozzle shadow: only parts taller than the lowest nozzle part by more than 0.5 mm can
// cast one, so they query (planShadowQueries) for the parts whose centre lies within reach, then
// the point-to-turned-rectangle distance. Fiducial clear circles are index queries too;
// containment in the board quad and the reach are per part. Hot loops run on typed arrays with
// fields in locals; the index hands back indices, not objects; findings go to a compact
// typed-array store (sink.ts) and become objects at the end (report.ts).
//
// `verifyBruteForce` runs the same exact tests on every pair (for the bench and the tests).

import Flatbush from 'flatbush';
import {
  TOUCH_EPS,
  TOUCH_EPS_AREA,
  cosSinDeg,
  makeCcw,
  pointRectDistance,
  pointsOutsideQuad,
  quadEdges,
  rectIntersectionArea,
  rectOutsideQuad,
  convexIntersectionArea,
  convexSatDepth,
} from './geom';
import {
  verifyProbe,
  FindingSink,
  K_BODY,
  K_BOARD_OVERLAP,
  K_COURTYARD,
  K_FIDUCIAL,
  K_NO_NOZZLE,
  K_NO_PACKAGE,
  K_NOZZLE_SIZE,
  K_OFF_BOARD,
  K_OFF_PANEL,
  K_OVERHANG,
  K_PANEL_REACH,
  K_REACH,
  K_SHADOW,
} from './sink';
import { buildReport } from './report';
import { scratchF64, scratchI32 } from './scratch';
import {
  SIDE_NAMES,
  type SideName,
  type VerifyInput,
  type VerifyOptions,
  type VerifyResult,
} from './types';

/** A neighbour must be taller than the part by more than this to shadow its nozzle (mm). The
 * 1e-6 keeps 1.1 − 0.6 (= 0.5000000000000001 in binary) from counting. */
export const SHADOW_HEIGHT_STEP = 0.5;
const SHADOW_STEP = SHADOW_HEIGHT_STEP + TOUCH_EPS;
export const DEFAULT_LIMIT = 10_000;

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

export class VerifyInputError extends Error {
  override name = 'VerifyInputError';
}

export { verifyProbe } from './sink';

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** Check a job's placements and outlines; findings sorted (errors first, then by kind, board and
 * reference). */
export function verify(input: VerifyInput, options: VerifyOptions = {}): VerifyResult {
  return run(input, options, false);
}

/** The same check with every pair of same-side parts tested exactly (no index): O(n²). */
export function verifyBruteForce(input: VerifyInput, options: VerifyOptions = {}): VerifyResult {
  return run(input, options, true);
}

function run(input: VerifyInput, options: VerifyOptions, brute: boolean): VerifyResult {
  const t0 = now();
  validateShape(input);
  const limit = options.limit ?? DEFAULT_LIMIT;
  if (!Number.isInteger(limit) || limit < 0) {
    throw new VerifyInputError(`limit must be a whole number ≥ 0, got ${limit}`);
  }
  const sides = sidesOf(options.sides ?? 'both');
  const P = prepare(input);
  const O = prepareOutlines(input);
  const sink = new FindingSink(limit);
  const probe = verifyProbe.onPhase;
  if (probe) probe('prepare');

  let placements = 0;
  let panelDone = false;
  for (const side of sides) {
    const ids = P.sideIds[side];
    placements += ids.length;
    // the indexed run works in the plan's cell order (neighbours next to each other)
    const plan = brute || ids.length === 0 ? null : planQueries(P, ids);
    const tree = plan ? buildTree(P, plan.ids) : null;
    if (probe) probe('index');
    if (plan && tree) pairsIndexed(P, plan, tree, sink);
    else pairsBrute(P, ids, sink);
    if (probe) probe('pairs');
    fiducialChecks(input, P, plan ? plan.ids : ids, side, tree, sink);
    singleChecks(input, P, O, ids, side, sink);
    // the panel layout is the same on both sides: check it once, on the first side that has it
    if (!panelDone && (O.panelBySide[side] >= 0 || hasBoards(input, side))) {
      panelChecks(input, O, side, sink);
      panelDone = true;
    }
  }
  const result = buildReport(input, P, O, sink, limit, placements, t0, now);
  if (probe) probe('report');
  return result;
}

function sidesOf(choice: string): number[] {
  if (choice === 'top') return [0];
  if (choice === 'bottom') return [1];
  if (choice === 'both') return [0, 1];
  throw new VerifyInputError(`sides must be top, bottom or both, got "${choice}"`);
}

function hasBoards(input: VerifyInput, side: number): boolean {
  const name = SIDE_NAMES[side];
  return input.boards.some((b) => b.side === name);
}

// ---------------------------------------------------------------------------------------------
// Input checks (precise misuse errors)

const NUMERIC = ['cx', 'cy', 'angleDeg', 'length', 'width', 'height', 'courtyard', 'holderRadius'] as const;
const NON_NEGATIVE = new Set(['length', 'width', 'height', 'courtyard', 'holderRadius']);
const FLAGS = ['side', 'overhang', 'hasPackage', 'hasNozzle'] as const;

/** Full validation: shape, then every number (precise messages). */
export function validateInput(input: VerifyInput): void {
  validateShape(input);
  const n = input.count;
  for (const f of NUMERIC) {
    const a = input[f];
    const nonNeg = NON_NEGATIVE.has(f);
    const lo = nonNeg ? 0 : -Infinity;
    for (let i = 0; i < n; i++) {
      const v = a[i];
      // v - v is NaN for NaN and ±Infinity
      if (v - v !== 0 || v < lo) {
        throw new VerifyInputError(
          `${f}[${i}] (${input.ref[i]}) is ${v}, expected a finite number${nonNeg ? ' ≥ 0' : ''}`,
        );
      }
    }
  }
}

/** Array lengths, side codes, outlines, fiducials, reach (the per-number checks run inside
 * prepare's single pass, falling back to validateInput for the message). */
function validateShape(input: VerifyInput): void {
  const n = input.count;
  if (!Number.isInteger(n) || n < 0) throw new VerifyInputError(`count must be a whole number ≥ 0, got ${n}`);
  const len = (name: string, v: { length: number } | undefined): void => {
    if (!v) throw new VerifyInputError(`${name} is missing, expected ${n} values`);
    if (v.length !== n) throw new VerifyInputError(`${name} has ${v.length} values, expected ${n} (count)`);
  };
  len('ref', input.ref);
  len('board', input.board);
  for (const f of FLAGS) len(f, input[f]);
  for (const f of NUMERIC) len(f, input[f]);
  const side = input.side;
  for (let i = 0; i < n; i++) {
    if (side[i] > 1) throw new VerifyInputError(`side[${i}] (${input.ref[i]}) is ${side[i]}, expected 0 (top) or 1 (bottom)`);
  }
  const quad = (what: string, c: ArrayLike<number>): void => {
    if (!c || c.length !== 8) throw new VerifyInputError(`${what} has ${c ? c.length : 0} corner numbers, expected 8`);
    for (let k = 0; k < 8; k++) if (!Number.isFinite(c[k])) throw new VerifyInputError(`${what} corner value ${k} is ${c[k]}`);
  };
  input.boards.forEach((b, k) => quad(`boards[${k}] (board ${b.board}, ${b.side})`, b.corners));
  input.panels.forEach((p, k) => quad(`panels[${k}] (${p.side})`, p.corners));
  input.fiducials.forEach((f, k) => {
    if (![f.x, f.y, f.clearRadius].every(Number.isFinite) || f.clearRadius < 0) {
      throw new VerifyInputError(`fiducials[${k}] (${f.name}) needs finite x, y and clearRadius ≥ 0`);
    }
  });
  if (input.reach && !(input.reach.x >= 0 && input.reach.y >= 0)) {
    throw new VerifyInputError(`reach must have x ≥ 0 and y ≥ 0, got ${input.reach.x} × ${input.reach.y}`);
  }
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

/** Parts per overlap query: neighbouring parts share one query (the union of their grown boxes),
 * which costs far less than one tree descent each; the few candidates are then box-tested against
 * the group's parts. */
export const GROUP_SIZE = 12;

/**
 * The overlap queries of one side. Parts are bucketed on a grid of cells holding about
 * `groupSize` parts each (a counting sort, O(n)) and put in cell order, serpentine row by row, so
 * that neighbours sit next to each other; the index is built in that order (build the tree over
 * `ids` of the plan). One query per non-empty cell: the union of its parts' grown boxes (body plus
 * courtyard).
 */
export interface QueryPlan {
  /** the side's placement indices in cell order; a "local index" is a position in it */
  ids: Int32Array;
  /** group g holds local indices start[g] .. start[g + 1] - 1 */
  start: Int32Array;
  groups: number;
  /** per group: minX, minY, maxX, maxY of the query */
  box: Float64Array;
  /** per local index: the part's grown box, four numbers side by side */
  own: Float64Array;
}

export function planQueries(P: Prepared, sideIds: Int32Array, groupSize = GROUP_SIZE): QueryPlan {
  const m = sideIds.length;
  const { cx, cy, gex, gey } = P;
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let k = 0; k < m; k++) {
    const i = sideIds[k];
    const x = cx[i];
    const y = cy[i];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  // grid of about m / groupSize cells over the part centres
  const w = maxX - minX || 1;
  const hgt = maxY - minY || 1;
  const cellsWanted = Math.max(1, Math.ceil(m / groupSize));
  const size = Math.sqrt((w * hgt) / cellsWanted) || 1;
  const cols = Math.max(1, Math.min(cellsWanted, Math.ceil(w / size)));
  const rows = Math.max(1, Math.min(cellsWanted, Math.ceil(hgt / size)));
  const sx = cols / w;
  const sy = rows / hgt;
  const cellOf = scratchI32('cellOf', m);
  const count = scratchI32('count', cols * rows + 1).fill(0);
  for (let k = 0; k < m; k++) {
    const i = sideIds[k];
    let c = ((cx[i] - minX) * sx) | 0;
    let r = ((cy[i] - minY) * sy) | 0;
    if (c >= cols) c = cols - 1;
    if (r >= rows) r = rows - 1;
    // serpentine rows keep consecutive cells adjacent
    const cell = r * cols + (r & 1 ? cols - 1 - c : c);
    cellOf[k] = cell;
    count[cell + 1]++;
  }
  let groups = 0;
  for (let c = 1; c <= cols * rows; c++) {
    if (count[c] > 0) groups++;
    count[c] += count[c - 1];
  }
  // stable within a cell, so the order depends only on the input
  const ids = scratchI32('planIds', m);
  const fill = scratchI32('fill', cols * rows);
  fill.set(count.subarray(0, cols * rows));
  for (let k = 0; k < m; k++) ids[fill[cellOf[k]]++] = sideIds[k];
  const own = scratchF64('own', 4 * m);
  for (let t = 0; t < m; t++) {
    const i = ids[t];
    const x = cx[i];
    const y = cy[i];
    const ex = gex[i];
    const ey = gey[i];
    own[4 * t] = x - ex;
    own[4 * t + 1] = y - ey;
    own[4 * t + 2] = x + ex;
    own[4 * t + 3] = y + ey;
  }
  const start = scratchI32('start', groups + 1);
  const box = scratchF64('box', 4 * groups);
  let g = 0;
  for (let c = 0; c < cols * rows; c++) {
    const a = count[c];
    const b = count[c + 1];
    if (a === b) continue;
    start[g] = a;
    let x0 = Infinity;
    let y0 = Infinity;
    let x1 = -Infinity;
    let y1 = -Infinity;
    for (let t = a; t < b; t++) {
      const o = 4 * t;
      if (own[o] < x0) x0 = own[o];
      if (own[o + 1] < y0) y0 = own[o + 1];
      if (own[o + 2] > x1) x1 = own[o + 2];
      if (own[o + 3] > y1) y1 = own[o + 3];
    }
    box[4 * g] = x0;
    box[4 * g + 1] = y0;
    box[4 * g + 2] = x1;
    box[4 * g + 3] = y1;
    g++;
  }
  start[groups] = m;
  return { ids, start, groups, box, own };
}

/** Height bins for the shadow reach (see planShadowQueries). */
const SHADOW_BINS = 64;

/**
 * The nozzle-shadow queries of one side, made from the taller parts. Only a part taller by more
 * than 0.5 mm than some part with a nozzle can cast a shadow (on most boards a minority: the low
 * chips are the many). Each such part's reach is its body's box widened by the largest holder
 * radius among the parts short enough for it to shadow: it holds the centre of every part it can
 * shadow. The taller parts of one overlap group (neighbours) share one query, the union of their
 * reaches.
 */
export interface ShadowPlan {
  /** local indices (into the plan's ids) of the parts that can shadow a neighbour, ascending */
  who: Int32Array;
  count: number;
  /** per such part: its reach, minX, minY, maxX, maxY */
  reach: Float64Array;
  /** query q covers who[start[q] .. start[q + 1]) */
  start: Int32Array;
  queries: number;
  /** per query: minX, minY, maxX, maxY */
  box: Float64Array;
}

export function planShadowQueries(P: Prepared, plan: QueryPlan): ShadowPlan {
  const { ids } = plan;
  const m = ids.length;
  const { cx, cy, c, s, hx, hy, h, R } = P;
  // heights of the parts that can be shadowed (those with a nozzle)
  let lo = Infinity;
  let hi = -Infinity;
  for (let k = 0; k < m; k++) {
    const i = ids[k];
    if (R[i] > 0) {
      if (h[i] < lo) lo = h[i];
      if (h[i] > hi) hi = h[i];
    }
  }
  const who = scratchI32('shadowWho', m);
  let count = 0;
  if (lo <= hi) {
    for (let k = 0; k < m; k++) if (h[ids[k]] - lo > SHADOW_STEP) who[count++] = k;
  }
  const reach = scratchF64('shadowReach', 4 * count);
  const start = scratchI32('shadowStart', count + 1);
  const box = scratchF64('shadowBox', 4 * count);
  if (count === 0) {
    start[0] = 0;
    return { who, count, reach, start, queries: 0, box };
  }
  // the largest holder radius per height bin, then a running maximum from the lowest bin up:
  // radiusUpTo[b] bounds the radius of every part in bins 0..b
  const radiusUpTo = new Float64Array(SHADOW_BINS);
  const scale = SHADOW_BINS / (hi - lo || 1);
  for (let k = 0; k < m; k++) {
    const i = ids[k];
    const r = R[i];
    if (r <= 0) continue;
    let b = ((h[i] - lo) * scale) | 0;
    if (b >= SHADOW_BINS) b = SHADOW_BINS - 1;
    if (r > radiusUpTo[b]) radiusUpTo[b] = r;
  }
  for (let b = 1; b < SHADOW_BINS; b++) if (radiusUpTo[b - 1] > radiusUpTo[b]) radiusUpTo[b] = radiusUpTo[b - 1];
  for (let t = 0; t < count; t++) {
    const i = ids[who[t]];
    // parts it can shadow are lower than h − 0.5: their bin is at most the threshold's bin (one
    // bin of margin for rounding)
    const th = (h[i] - SHADOW_STEP - lo) * scale;
    let b = th >= SHADOW_BINS - 1 ? SHADOW_BINS - 1 : (th | 0) + 1;
    if (b >= SHADOW_BINS) b = SHADOW_BINS - 1;
    const r = radiusUpTo[b];
    const ac = Math.abs(c[i]);
    const as = Math.abs(s[i]);
    const ex = ac * hx[i] + as * hy[i] + r;
    const ey = as * hx[i] + ac * hy[i] + r;
    reach[4 * t] = cx[i] - ex;
    reach[4 * t + 1] = cy[i] - ey;
    reach[4 * t + 2] = cx[i] + ex;
    reach[4 * t + 3] = cy[i] + ey;
  }
  // one query per overlap group that has taller parts (who is ascending, groups are ranges)
  let queries = 0;
  let t = 0;
  for (let g = 0; g < plan.groups && t < count; g++) {
    const end = plan.start[g + 1];
    if (who[t] >= end) continue;
    start[queries] = t;
    let x0 = Infinity;
    let y0 = Infinity;
    let x1 = -Infinity;
    let y1 = -Infinity;
    for (; t < count && who[t] < end; t++) {
      const o = 4 * t;
      if (reach[o] < x0) x0 = reach[o];
      if (reach[o + 1] < y0) y0 = reach[o + 1];
      if (reach[o + 2] > x1) x1 = reach[o + 2];
      if (reach[o + 3] > y1) y1 = reach[o + 3];
    }
    box[4 * queries] = x0;
    box[4 * queries + 1] = y0;
    box[4 * queries + 2] = x1;
    box[4 * queries + 3] = y1;
    queries++;
  }
  start[queries] = count;
  return { who, count, reach, start, queries, box };
}

// ---------------------------------------------------------------------------------------------
// Pair kinds: body overlap, courtyard overlap, nozzle shadow

// The exact tests of one pair, shared by the indexed and the brute-force runs. Module-level
// functions (not closures made per run), so optimized callers keep a stable call target.

/** Bodies and courtyards of i and j (i ≠ j, same side). */
function overlapPair(P: Prepared, sink: FindingSink, i: number, j: number): void {
  const { cx, cy, c, s, hx, hy, g } = P;
  const ax = cx[i];
  const ay = cy[i];
  const dx = cx[j] - ax;
  const dy = cy[j] - ay;
  const ac = c[i];
  const as = s[i];
  const bc = c[j];
  const bs = s[j];
  const gi = g[i];
  const gj = g[j];
  const ahx = hx[i];
  const ahy = hy[i];
  const bhx = hx[j];
  const bhy = hy[j];
  const C = Math.abs(ac * bc + as * bs);
  const S = Math.abs(as * bc - ac * bs);
  // courtyards (bodies grown by their courtyard excess): the four separating axes, early exit
  const pA = Math.abs(dx * ac + dy * as);
  let d = ahx + gi + (bhx + gj) * C + (bhy + gj) * S - pA;
  if (d <= TOUCH_EPS) return;
  const pB = Math.abs(dy * ac - dx * as);
  let o = ahy + gi + (bhx + gj) * S + (bhy + gj) * C - pB;
  if (o <= TOUCH_EPS) return;
  if (o < d) d = o;
  const pC = Math.abs(dx * bc + dy * bs);
  o = (ahx + gi) * C + (ahy + gi) * S + bhx + gj - pC;
  if (o <= TOUCH_EPS) return;
  if (o < d) d = o;
  const pD = Math.abs(dy * bc - dx * bs);
  o = (ahx + gi) * S + (ahy + gi) * C + bhy + gj - pD;
  if (o <= TOUCH_EPS) return;
  if (o < d) d = o;
  if (rectIntersectionArea(ax, ay, ac, as, ahx + gi, ahy + gi, cx[j], cy[j], bc, bs, bhx + gj, bhy + gj) <= TOUCH_EPS_AREA) {
    return;
  }
  // the bodies themselves
  let bd = ahx + bhx * C + bhy * S - pA;
  o = ahy + bhx * S + bhy * C - pB;
  if (o < bd) bd = o;
  o = ahx * C + ahy * S + bhx - pC;
  if (o < bd) bd = o;
  o = ahx * S + ahy * C + bhy - pD;
  if (o < bd) bd = o;
  if (bd > TOUCH_EPS && rectIntersectionArea(ax, ay, ac, as, ahx, ahy, cx[j], cy[j], bc, bs, bhx, bhy) > TOUCH_EPS_AREA) {
    sink.add(K_BODY, i, j, 0, bd, 0);
  } else {
    sink.add(K_COURTYARD, i, j, 0, d, NaN);
  }
}

/** Does the taller neighbour j (h[j] − h[i] > 0.5 already known) lie, by its body, within the
 * nozzle holder radius of i's centre? */
function shadowPair(P: Prepared, sink: FindingSink, i: number, j: number): void {
  const { cx, cy, c, s, hx, hy, R } = P;
  const r = R[i] - TOUCH_EPS;
  if (r <= 0) return;
  const dx = cx[i] - cx[j];
  const dy = cy[i] - cy[j];
  const cj = c[j];
  const sj = s[j];
  let lx = Math.abs(dx * cj + dy * sj) - hx[j];
  if (lx >= r) return;
  let ly = Math.abs(dy * cj - dx * sj) - hy[j];
  if (ly >= r) return;
  if (lx < 0) lx = 0;
  if (ly < 0) ly = 0;
  const d2 = lx * lx + ly * ly;
  if (d2 < r * r) {
    const dist = Math.sqrt(d2);
    sink.add(K_SHADOW, i, j, 0, R[i] - dist, dist);
  }
}

// The current group's candidates after its first part (module state: the engine is synchronous
// and never re-entered).
let cand = new Int32Array(256);

function pairsIndexed(P: Prepared, plan: QueryPlan, tree: Flatbush, sink: FindingSink): void {
  overlapsIndexed(P, plan, tree, sink);
  if (verifyProbe.onPhase) verifyProbe.onPhase('overlaps');
  shadowsIndexed(P, plan, tree, sink);
}

/** Bodies and courtyards: each unordered pair whose grown boxes meet, once, from the part that
 * comes first in cell order (the other is a candidate of its group's query, as the union of the
 * group's boxes holds its own box). */
function overlapsIndexed(P: Prepared, plan: QueryPlan, tree: Flatbush, sink: FindingSink): void {
  const { ids, start, box, own } = plan;
  for (let g = 0; g < plan.groups; g++) {
    // one descent of the tree for the whole group
    const hits = tree.search(box[4 * g], box[4 * g + 1], box[4 * g + 2], box[4 * g + 3]);
    const first = start[g];
    const end = start[g + 1];
    // pairs with parts of earlier groups were found there
    if (cand.length < hits.length) cand = new Int32Array(2 * hits.length);
    const cd = cand;
    let n = 0;
    for (let h = 0; h < hits.length; h++) {
      const kj = hits[h];
      if (kj > first) cd[n++] = kj;
    }
    // each candidate against the group's parts before it (a loop bound instead of a test)
    for (let c = 0; c < n; c++) {
      const kj = cd[c];
      const o = 4 * kj;
      const bx0 = own[o];
      const by0 = own[o + 1];
      const bx1 = own[o + 2];
      const by1 = own[o + 3];
      const last = kj < end ? kj : end;
      for (let k = first; k < last; k++) {
        const q = 4 * k;
        // one branch for the four comparisons (they are unpredictable; the result rarely is)
        if ((+(own[q] <= bx1) & +(own[q + 2] >= bx0) & +(own[q + 1] <= by1) & +(own[q + 3] >= by0)) === 0) continue;
        overlapPair(P, sink, ids[k], ids[kj]);
      }
    }
  }
}

/** Nozzle shadows, found from the taller parts (see planShadowQueries). */
function shadowsIndexed(P: Prepared, plan: QueryPlan, tree: Flatbush, sink: FindingSink): void {
  const ids = plan.ids;
  const sp = planShadowQueries(P, plan);
  const { who, reach, start, box } = sp;
  const { cx, cy, h, R } = P;
  for (let q = 0; q < sp.queries; q++) {
    const hits = tree.search(box[4 * q], box[4 * q + 1], box[4 * q + 2], box[4 * q + 3]);
    const nh = hits.length;
    const last = start[q + 1];
    for (let t = start[q]; t < last; t++) {
      const kj = who[t];
      // j: the taller part; i: a candidate it may shadow (its centre in j's reach)
      const hj = h[ids[kj]];
      const rx0 = reach[4 * t];
      const ry0 = reach[4 * t + 1];
      const rx1 = reach[4 * t + 2];
      const ry1 = reach[4 * t + 3];
      for (let c = 0; c < nh; c++) {
        const k = hits[c];
        if (k === kj) continue;
        const i = ids[k];
        if (R[i] <= TOUCH_EPS || !(hj - h[i] > SHADOW_STEP)) continue;
        const xi = cx[i];
        const yi = cy[i];
        if (xi < rx0 || xi > rx1 || yi < ry0 || yi > ry1) continue;
        shadowPair(P, sink, i, ids[kj]);
      }
    }
  }
}

function pairsBrute(P: Prepared, ids: Int32Array, sink: FindingSink): void {
  const { h, R } = P;
  const m = ids.length;
  for (let a = 0; a < m; a++) {
    const i = ids[a];
    const hi = h[i];
    const ri = R[i];
    for (let b = a + 1; b < m; b++) {
      const j = ids[b];
      const hj = h[j];
      if (ri > 0 && hj - hi > SHADOW_STEP) shadowPair(P, sink, i, j);
      else if (R[j] > 0 && hi - hj > SHADOW_STEP) shadowPair(P, sink, j, i);
      overlapPair(P, sink, i, j);
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Fiducial clear circles

function fiducialChecks(
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

function singleChecks(
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

function panelChecks(input: VerifyInput, O: PreparedOutlines, side: number, sink: FindingSink): void {
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
