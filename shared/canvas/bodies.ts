// Batch geometry for drawing placements: body and courtyard corner arrays, pin-1 mark positions
// and the spatial index's boxes. Pure; everything is derived from what the engine computed
// (RunResult body centre x/y, rotation, bodyLength/bodyWidth, courtyard), nothing is re-derived
// from the design.
import type { PlacementColumns } from '../core';

/** A part without a package is drawn (and hit) as a small square of this side, mm. */
export const POINT_BODY = 0.5;

/** How a package shows its pin 1 in the zero orientation (IPC-7351B zero, from memory): two-
 * terminal parts have pin 1 (cathode / positive end) on the left; ICs and the rest at the upper
 * left corner. */
export type PinOneStyle = 'end' | 'corner';

const TWO_TERMINAL = /^(R|C|L|D|F|FB|LED|CP|ECAP|EC|IND|SOD|SMA|SMB|SMC|DO|MELF|MINIMELF|CAPAE|RES|CAP)(?![A-Z])/i;

/** Pin-1 style from the package name (or footprint when unmatched). A heuristic on the name's
 * leading letters: R0603, C0402, LED0603, SOD-123, SMA, ECAP-6.3x5.8, IND-4x4 are two-terminal;
 * SOT-23, SOIC-8, QFN-32, XTAL-3225, HDR-1x4 are not. */
export function pinOneStyle(name: string | null | undefined): PinOneStyle {
  if (!name) return 'corner';
  return TWO_TERMINAL.test(name.trim()) ? 'end' : 'corner';
}

const DEG = Math.PI / 180;

/** Half extents of body i (a point body for unmatched parts), optionally grown by `grow` mm. */
function halfExtents(p: PlacementColumns, i: number, grow: number): [number, number] {
  const L = p.bodyLength[i];
  const W = p.bodyWidth[i];
  if (!(L > 0) || !(W > 0)) return [POINT_BODY / 2, POINT_BODY / 2];
  return [L / 2 + grow, W / 2 + grow];
}

/**
 * Corners of every body: Float32Array(8·count) of x0 y0 … x3 y3, counter-clockwise from the body's
 * own lower-left corner (in its zero orientation), turned by the output rotation about the body
 * centre. With `courtyard` true the body is grown by its courtyard excess on every side.
 */
export function bodyQuads(p: PlacementColumns, courtyard = false): Float64Array {
  const n = p.count;
  const out = new Float64Array(8 * n);
  for (let i = 0; i < n; i++) {
    const g = courtyard ? p.courtyard[i] || 0 : 0;
    const [hl, hw] = halfExtents(p, i, g);
    const r = p.rotation[i] * DEG;
    const c = Math.cos(r), s = Math.sin(r);
    const cx = p.x[i], cy = p.y[i];
    // local corners (−hl,−hw) (hl,−hw) (hl,hw) (−hl,hw)
    const ax = c * hl, ay = s * hl; // turned half-length vector
    const bx = -s * hw, by = c * hw; // turned half-width vector
    const k = 8 * i;
    out[k] = cx - ax - bx; out[k + 1] = cy - ay - by;
    out[k + 2] = cx + ax - bx; out[k + 3] = cy + ay - by;
    out[k + 4] = cx + ax + bx; out[k + 5] = cy + ay + by;
    out[k + 6] = cx - ax + bx; out[k + 7] = cy - ay + by;
  }
  return out;
}

/** Axis-aligned boxes of quads: Float64Array(4·count) minX minY maxX maxY. */
export function quadBoxes(quads: Float64Array): Float64Array {
  const n = quads.length / 8;
  const out = new Float64Array(4 * n);
  for (let i = 0; i < n; i++) {
    const k = 8 * i;
    let minX = quads[k], maxX = minX, minY = quads[k + 1], maxY = minY;
    for (let j = 2; j < 8; j += 2) {
      const x = quads[k + j], y = quads[k + j + 1];
      if (x < minX) minX = x; else if (x > maxX) maxX = x;
      if (y < minY) minY = y; else if (y > maxY) maxY = y;
    }
    out[4 * i] = minX; out[4 * i + 1] = minY; out[4 * i + 2] = maxX; out[4 * i + 3] = maxY;
  }
  return out;
}

/**
 * Pin-1 marks: Float64Array(3·count) of x, y, radius (mm). The mark sits inside the body near its
 * pin-1 end or corner in the package's zero orientation, turned with the part — so a part turned
 * by 180° shows its mark at the other end.
 */
export function pinOneMarks(p: PlacementColumns): Float64Array {
  const n = p.count;
  const out = new Float64Array(3 * n);
  const styleCache = new Map<string, PinOneStyle>();
  for (let i = 0; i < n; i++) {
    const [hl, hw] = halfExtents(p, i, 0);
    const name = p.packageName[i] ?? p.footprint[i] ?? '';
    let style = styleCache.get(name);
    if (!style) styleCache.set(name, (style = pinOneStyle(name)));
    const rad = Math.max(0.04, Math.min(0.45, Math.min(hl, hw) * 0.3));
    const lx = -hl + rad * 1.3;
    const ly = style === 'end' ? 0 : hw - rad * 1.3;
    const r = p.rotation[i] * DEG;
    const c = Math.cos(r), s = Math.sin(r);
    out[3 * i] = p.x[i] + c * lx - s * ly;
    out[3 * i + 1] = p.y[i] + s * lx + c * ly;
    out[3 * i + 2] = rad;
  }
  return out;
}
