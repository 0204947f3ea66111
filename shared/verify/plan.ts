// The broad phase of a check: which parts are tested against which. Parts are grouped in grid
// cells (one index query per group for overlaps), and only parts tall enough to shadow a nozzle
// query for their neighbours.
import { TOUCH_EPS } from './geom';
import type { Prepared } from './prepare';
import { scratchF64, scratchI32 } from './scratch';

/** A neighbour must be taller than the part by more than this to shadow its nozzle (mm). The
 * 1e-6 keeps 1.1 − 0.6 (= 0.5000000000000001 in binary) from counting. */
export const SHADOW_HEIGHT_STEP = 0.5;
export const SHADOW_STEP = SHADOW_HEIGHT_STEP + TOUCH_EPS;

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
