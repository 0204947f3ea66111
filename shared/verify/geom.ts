// Exact geometry of the findings engine: turned rectangles (centre, unit axis, half sizes), convex
// quadrilaterals, separating-axis depth, convex clipping. Plain numbers and typed arrays, no
// allocation in the functions the hot loops call.

/** Touching is not overlapping: a depth (mm) or an area (mm²) must exceed this to count. */
export const TOUCH_EPS = 1e-6;
export const TOUCH_EPS_AREA = 1e-6;

/** cos and sin of an angle in degrees, exact at multiples of 90° (so 0/90/180/270 parts have
 * exactly parallel edges and touching stays touching). */
export function cosSinDeg(a: number, out: Float64Array, at: number): void {
  let r = a % 360;
  if (r < 0) r += 360;
  if (r === 0) {
    out[at] = 1;
    out[at + 1] = 0;
  } else if (r === 90) {
    out[at] = 0;
    out[at + 1] = 1;
  } else if (r === 180) {
    out[at] = -1;
    out[at + 1] = 0;
  } else if (r === 270) {
    out[at] = 0;
    out[at + 1] = -1;
  } else {
    const t = (r * Math.PI) / 180;
    out[at] = Math.cos(t);
    out[at + 1] = Math.sin(t);
  }
}

/**
 * Penetration depth of two turned rectangles by the separating-axis theorem: the smallest overlap
 * of their projections on the four edge normals (the shortest push that separates them).
 * ≤ 0 when they are apart or touch. (c, s) is the unit direction of the rectangle's length, (hx,
 * hy) its half length and half width.
 */
export function rectSatDepth(
  ax: number, ay: number, ac: number, as: number, ahx: number, ahy: number,
  bx: number, by: number, bc: number, bs: number, bhx: number, bhy: number,
): number {
  const dx = bx - ax;
  const dy = by - ay;
  const C = Math.abs(ac * bc + as * bs);
  const S = Math.abs(as * bc - ac * bs);
  let d = ahx + bhx * C + bhy * S - Math.abs(dx * ac + dy * as);
  if (d <= 0) return d;
  let o = ahy + bhx * S + bhy * C - Math.abs(dy * ac - dx * as);
  if (o < d) {
    if (o <= 0) return o;
    d = o;
  }
  o = ahx * C + ahy * S + bhx - Math.abs(dx * bc + dy * bs);
  if (o < d) {
    if (o <= 0) return o;
    d = o;
  }
  o = ahx * S + ahy * C + bhy - Math.abs(dy * bc - dx * bs);
  return o < d ? o : d;
}

/** Corners of a turned rectangle, counter-clockwise, into out[at .. at+7]. */
export function rectCorners(
  cx: number, cy: number, c: number, s: number, hx: number, hy: number,
  out: Float64Array | number[], at = 0,
): void {
  const ux = c * hx;
  const uy = s * hx;
  const vx = -s * hy;
  const vy = c * hy;
  out[at] = cx - ux - vx;
  out[at + 1] = cy - uy - vy;
  out[at + 2] = cx + ux - vx;
  out[at + 3] = cy + uy - vy;
  out[at + 4] = cx + ux + vx;
  out[at + 5] = cy + uy + vy;
  out[at + 6] = cx - ux + vx;
  out[at + 7] = cy - uy + vy;
}

/** Signed area of a polygon of n points (x0, y0, x1, y1, ...): positive when counter-clockwise. */
export function polygonArea(p: ArrayLike<number>, n: number): number {
  let a = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    a += p[2 * j] * p[2 * i + 1] - p[2 * i] * p[2 * j + 1];
  }
  return a / 2;
}

/** Reverse a polygon's point order in place when it is clockwise (so it becomes counter-clockwise). */
export function makeCcw(p: Float64Array | number[], n: number): void {
  if (polygonArea(p, n) >= 0) return;
  for (let i = 0, j = n - 1; i < j; i++, j--) {
    const tx = p[2 * i];
    const ty = p[2 * i + 1];
    p[2 * i] = p[2 * j];
    p[2 * i + 1] = p[2 * j + 1];
    p[2 * j] = tx;
    p[2 * j + 1] = ty;
  }
}

/**
 * Intersection of two convex polygons (both counter-clockwise) by Sutherland–Hodgman clipping of
 * `a` against every edge of `b`. Writes the result into `out` (needs 2·(na + nb) numbers; `tmp`
 * the same) and returns its point count (0 when they do not meet).
 */
export function clipConvex(
  a: ArrayLike<number>, na: number, b: ArrayLike<number>, nb: number,
  out: Float64Array, tmp: Float64Array,
): number {
  // ping-pong between the two buffers so the last pass lands in `out`
  let src: Float64Array = nb % 2 === 0 ? out : tmp;
  let dst: Float64Array = nb % 2 === 0 ? tmp : out;
  for (let i = 0; i < 2 * na; i++) src[i] = a[i];
  let n = na;
  for (let e = 0; e < nb && n > 0; e++) {
    const px = b[2 * e];
    const py = b[2 * e + 1];
    const en = e + 1 === nb ? 0 : e + 1;
    const ex = b[2 * en] - px;
    const ey = b[2 * en + 1] - py;
    let m = 0;
    let sx = src[2 * n - 2];
    let sy = src[2 * n - 1];
    let sc = ex * (sy - py) - ey * (sx - px);
    for (let k = 0; k < n; k++) {
      const qx = src[2 * k];
      const qy = src[2 * k + 1];
      const qc = ex * (qy - py) - ey * (qx - px);
      if (qc >= 0) {
        if (sc < 0) {
          const t = sc / (sc - qc);
          dst[2 * m] = sx + t * (qx - sx);
          dst[2 * m + 1] = sy + t * (qy - sy);
          m++;
        }
        dst[2 * m] = qx;
        dst[2 * m + 1] = qy;
        m++;
      } else if (sc >= 0) {
        const t = sc / (sc - qc);
        dst[2 * m] = sx + t * (qx - sx);
        dst[2 * m + 1] = sy + t * (qy - sy);
        m++;
      }
      sx = qx;
      sy = qy;
      sc = qc;
    }
    n = m;
    const swap = src;
    src = dst;
    dst = swap;
  }
  if (n > 0 && src !== out) for (let i = 0; i < 2 * n; i++) out[i] = src[i];
  return n;
}

const rectA = new Float64Array(8);
const rectB = new Float64Array(8);
const clipOut = new Float64Array(32);
const clipTmp = new Float64Array(32);

/** Area common to two turned rectangles (mm²). Uses module scratch buffers: not re-entrant. */
export function rectIntersectionArea(
  ax: number, ay: number, ac: number, as: number, ahx: number, ahy: number,
  bx: number, by: number, bc: number, bs: number, bhx: number, bhy: number,
): number {
  // a rectangle without area (a part without a package is a point) shares no area with anything
  if (ahx <= 0 || ahy <= 0 || bhx <= 0 || bhy <= 0) return 0;
  rectCorners(ax, ay, ac, as, ahx, ahy, rectA);
  rectCorners(bx, by, bc, bs, bhx, bhy, rectB);
  const n = clipConvex(rectA, 4, rectB, 4, clipOut, clipTmp);
  return n < 3 ? 0 : Math.abs(polygonArea(clipOut, n));
}

/** The polygon common to two turned rectangles, as [x, y] pairs (empty when they do not meet). */
export function rectIntersectionPolygon(
  ax: number, ay: number, ac: number, as: number, ahx: number, ahy: number,
  bx: number, by: number, bc: number, bs: number, bhx: number, bhy: number,
): [number, number][] {
  rectCorners(ax, ay, ac, as, ahx, ahy, rectA);
  rectCorners(bx, by, bc, bs, bhx, bhy, rectB);
  return convexIntersectionPolygon(rectA, 4, rectB, 4);
}

/** The polygon common to two convex counter-clockwise polygons, as [x, y] pairs. */
export function convexIntersectionPolygon(
  a: ArrayLike<number>, na: number, b: ArrayLike<number>, nb: number,
): [number, number][] {
  const cap = 2 * (na + nb) + 4;
  const out = new Float64Array(cap);
  const tmp = new Float64Array(cap);
  const n = clipConvex(a, na, b, nb, out, tmp);
  const pts: [number, number][] = [];
  for (let i = 0; i < n; i++) pts.push([out[2 * i], out[2 * i + 1]]);
  return pts;
}

/** Penetration depth of two convex counter-clockwise polygons (separating axes = every edge
 * normal of both); ≤ 0 when apart or touching. */
export function convexSatDepth(a: ArrayLike<number>, na: number, b: ArrayLike<number>, nb: number): number {
  let depth = Infinity;
  for (let pass = 0; pass < 2; pass++) {
    const p = pass === 0 ? a : b;
    const np = pass === 0 ? na : nb;
    for (let e = 0; e < np; e++) {
      const en = e + 1 === np ? 0 : e + 1;
      let nx = -(p[2 * en + 1] - p[2 * e + 1]);
      let ny = p[2 * en] - p[2 * e];
      const len = Math.hypot(nx, ny);
      if (len === 0) continue;
      nx /= len;
      ny /= len;
      let a0 = Infinity, a1 = -Infinity, b0 = Infinity, b1 = -Infinity;
      for (let k = 0; k < na; k++) {
        const v = a[2 * k] * nx + a[2 * k + 1] * ny;
        if (v < a0) a0 = v;
        if (v > a1) a1 = v;
      }
      for (let k = 0; k < nb; k++) {
        const v = b[2 * k] * nx + b[2 * k + 1] * ny;
        if (v < b0) b0 = v;
        if (v > b1) b1 = v;
      }
      const o = Math.min(a1, b1) - Math.max(a0, b0);
      if (o < depth) depth = o;
      if (depth <= 0) return depth;
    }
  }
  return depth;
}

/** Area common to two convex counter-clockwise polygons (mm²). */
export function convexIntersectionArea(a: ArrayLike<number>, na: number, b: ArrayLike<number>, nb: number): number {
  const cap = 2 * (na + nb) + 4;
  const out = new Float64Array(cap);
  const tmp = new Float64Array(cap);
  const n = clipConvex(a, na, b, nb, out, tmp);
  return n < 3 ? 0 : Math.abs(polygonArea(out, n));
}

/** Distance from a point to a turned rectangle (0 inside or on it). */
export function pointRectDistance(
  px: number, py: number, cx: number, cy: number, c: number, s: number, hx: number, hy: number,
): number {
  const dx = px - cx;
  const dy = py - cy;
  let lx = Math.abs(dx * c + dy * s) - hx;
  let ly = Math.abs(dy * c - dx * s) - hy;
  if (lx < 0) lx = 0;
  if (ly < 0) ly = 0;
  return Math.sqrt(lx * lx + ly * ly);
}

/** The point of a turned rectangle nearest to (px, py) (the point itself when inside). */
export function nearestPointOnRect(
  px: number, py: number, cx: number, cy: number, c: number, s: number, hx: number, hy: number,
): [number, number] {
  const dx = px - cx;
  const dy = py - cy;
  let lu = dx * c + dy * s;
  let lv = dy * c - dx * s;
  if (lu > hx) lu = hx;
  else if (lu < -hx) lu = -hx;
  if (lv > hy) lv = hy;
  else if (lv < -hy) lv = -hy;
  return [cx + lu * c - lv * s, cy + lu * s + lv * c];
}

/** Distance between two convex polygons that do not overlap (0 when they touch or overlap):
 * the smallest point-to-edge distance either way. */
export function convexGap(a: ArrayLike<number>, na: number, b: ArrayLike<number>, nb: number): number {
  let best = Infinity;
  for (let pass = 0; pass < 2; pass++) {
    const p = pass === 0 ? a : b;
    const np = pass === 0 ? na : nb;
    const q = pass === 0 ? b : a;
    const nq = pass === 0 ? nb : na;
    for (let k = 0; k < np; k++) {
      const x = p[2 * k];
      const y = p[2 * k + 1];
      for (let e = 0; e < nq; e++) {
        const en = e + 1 === nq ? 0 : e + 1;
        const d = pointSegmentDistance(x, y, q[2 * e], q[2 * e + 1], q[2 * en], q[2 * en + 1]);
        if (d < best) best = d;
      }
    }
  }
  return best;
}

export function pointSegmentDistance(
  x: number, y: number, x0: number, y0: number, x1: number, y1: number,
): number {
  const ex = x1 - x0;
  const ey = y1 - y0;
  const len2 = ex * ex + ey * ey;
  let t = len2 === 0 ? 0 : ((x - x0) * ex + (y - y0) * ey) / len2;
  if (t < 0) t = 0;
  else if (t > 1) t = 1;
  return Math.hypot(x - x0 - t * ex, y - y0 - t * ey);
}

/**
 * Inward unit normals and offsets of a convex counter-clockwise quad, for containment tests:
 * out[4e .. 4e+3] = nx, ny, px, py (edge e from corner e, inward normal n).
 */
export function quadEdges(q: ArrayLike<number>, out: Float64Array, at = 0): void {
  for (let e = 0; e < 4; e++) {
    const en = (e + 1) & 3;
    const ex = q[2 * en] - q[2 * e];
    const ey = q[2 * en + 1] - q[2 * e + 1];
    const len = Math.hypot(ex, ey) || 1;
    out[at + 4 * e] = -ey / len;
    out[at + 4 * e + 1] = ex / len;
    out[at + 4 * e + 2] = q[2 * e];
    out[at + 4 * e + 3] = q[2 * e + 1];
  }
}

/** How far a turned rectangle reaches outside a convex quad given by quadEdges (≤ 0 inside):
 * the largest distance of a corner beyond an edge line. */
export function rectOutsideQuad(
  edges: Float64Array, at: number,
  cx: number, cy: number, c: number, s: number, hx: number, hy: number,
): number {
  let out = -Infinity;
  for (let e = 0; e < 4; e++) {
    const o = at + 4 * e;
    const nx = edges[o];
    const ny = edges[o + 1];
    const inside =
      (cx - edges[o + 2]) * nx + (cy - edges[o + 3]) * ny -
      hx * Math.abs(c * nx + s * ny) - hy * Math.abs(c * ny - s * nx);
    if (-inside > out) out = -inside;
  }
  return out;
}

/** How far any of n points reaches outside a convex quad given by quadEdges (≤ 0 inside). */
export function pointsOutsideQuad(edges: Float64Array, at: number, p: ArrayLike<number>, n: number): number {
  let out = -Infinity;
  for (let e = 0; e < 4; e++) {
    const o = at + 4 * e;
    for (let k = 0; k < n; k++) {
      const d = -((p[2 * k] - edges[o + 2]) * edges[o] + (p[2 * k + 1] - edges[o + 3]) * edges[o + 1]);
      if (d > out) out = d;
    }
  }
  return out;
}
