// The canvas view transform: output-frame millimetres (Y up) ↔ screen pixels (Y down). Pure.
//
//   screenX = ox + s · x        x = (screenX − ox) / s
//   screenY = oy − s · y        y = (oy − screenY) / s
//
// `s` is pixels per millimetre; (ox, oy) is where the frame's origin lands on the screen. The Y
// axis is flipped here, once, so text drawn in screen space stays upright.
import type { Box } from '../geometry';

export interface ViewTransform {
  /** pixels per mm */
  s: number;
  /** screen position of the frame origin, px */
  ox: number;
  oy: number;
}

export const MIN_SCALE = 0.05;
export const MAX_SCALE = 2000;

export const clampScale = (s: number): number => Math.min(MAX_SCALE, Math.max(MIN_SCALE, s));

export function worldToScreen(v: ViewTransform, x: number, y: number): { x: number; y: number } {
  return { x: v.ox + v.s * x, y: v.oy - v.s * y };
}

export function screenToWorld(v: ViewTransform, sx: number, sy: number): { x: number; y: number } {
  return { x: (sx - v.ox) / v.s, y: (v.oy - sy) / v.s };
}

/** The world box (mm) that the screen rectangle [0, width] × [0, height] shows. */
export function visibleWorldBox(v: ViewTransform, width: number, height: number): Box {
  return { minX: -v.ox / v.s, maxX: (width - v.ox) / v.s, minY: (v.oy - height) / v.s, maxY: v.oy / v.s };
}

/** Fit `box` into a width × height viewport with `margin` px on every side, centred. */
export function fitView(box: Box, width: number, height: number, margin = 24): ViewTransform {
  const bw = Math.max(box.maxX - box.minX, 1e-6);
  const bh = Math.max(box.maxY - box.minY, 1e-6);
  const s = clampScale(Math.min(Math.max(width - 2 * margin, 1) / bw, Math.max(height - 2 * margin, 1) / bh));
  const cx = (box.minX + box.maxX) / 2;
  const cy = (box.minY + box.maxY) / 2;
  return { s, ox: width / 2 - s * cx, oy: height / 2 + s * cy };
}

/** Zoom by `factor` keeping the world point under the screen point (sx, sy) in place. */
export function zoomAbout(v: ViewTransform, sx: number, sy: number, factor: number): ViewTransform {
  const s = clampScale(v.s * factor);
  const k = s / v.s;
  return { s, ox: sx - k * (sx - v.ox), oy: sy - k * (sy - v.oy) };
}

/** Move the picture by (dx, dy) screen pixels. */
export function panBy(v: ViewTransform, dx: number, dy: number): ViewTransform {
  return { s: v.s, ox: v.ox + dx, oy: v.oy + dy };
}

/** Centre the view on world point (x, y), keeping the scale. */
export function centreOn(v: ViewTransform, x: number, y: number, width: number, height: number): ViewTransform {
  return { s: v.s, ox: width / 2 - v.s * x, oy: height / 2 + v.s * y };
}

/**
 * A "nice" scale-bar length: the largest 1·10ⁿ, 2·10ⁿ or 5·10ⁿ mm that is at most `maxPx` pixels
 * long at `s` px/mm.
 */
export function scaleBarLength(s: number, maxPx = 120): number {
  const maxMm = maxPx / s;
  const p = Math.pow(10, Math.floor(Math.log10(maxMm)));
  for (const m of [5, 2, 1]) if (m * p <= maxMm) return m * p;
  return p;
}
