// The narrow phase of a check: the exact tests of each candidate pair (bodies, courtyards, nozzle
// shadow), over the index (plan.ts) or over every pair (brute force).
import type Flatbush from 'flatbush';
import { TOUCH_EPS, TOUCH_EPS_AREA, rectIntersectionArea } from './geom';
import { SHADOW_STEP, planShadowQueries, type QueryPlan } from './plan';
import type { Prepared } from './prepare';
import { FindingSink, K_BODY, K_COURTYARD, K_SHADOW, verifyProbe } from './sink';

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

export function pairsIndexed(P: Prepared, plan: QueryPlan, tree: Flatbush, sink: FindingSink): void {
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

export function pairsBrute(P: Prepared, ids: Int32Array, sink: FindingSink): void {
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
