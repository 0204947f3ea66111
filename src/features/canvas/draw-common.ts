// What every canvas drawing pass shares: the viewport, the batch size, the world transform (Y up)
// and the culling of bodies through the body index.
import { visibleBodies, visibleWorldBox, type ViewTransform } from '../../../shared/canvas';
import type { Box } from '../../../shared/geometry';
import type { Scene } from './scene';

export interface Viewport {
  view: ViewTransform;
  width: number;
  height: number;
}

/** A comment pinned at output-frame coordinates of one side. */
export interface CanvasNote {
  id: string;
  side: 'top' | 'bottom';
  x: number;
  y: number;
  text: string;
  author?: string;
  createdAt?: string;
}

/** Shapes per path: small paths keep the rasteriser linear. */
export const BATCH = 200;

export const contains = (outer: Box, inner: Box) => outer.minX <= inner.minX && outer.minY <= inner.minY && outer.maxX >= inner.maxX && outer.maxY >= inner.maxY;
export const meets = (a: Box, b: Box) => a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;

/** Draw in the world frame (mm, Y up) until the matching `ctx.restore()`. */
export function worldOn(ctx: CanvasRenderingContext2D, v: ViewTransform) {
  ctx.save();
  ctx.transform(v.s, 0, 0, -v.s, v.ox, v.oy);
}

/** Indices of the bodies on screen (all of them, without a search, when the whole panel shows). */
export function bodiesOnScreen(scene: Scene, vp: Viewport): ArrayLike<number> | null {
  const box = visibleWorldBox(vp.view, vp.width, vp.height);
  if (contains(box, scene.bodyBounds)) return null; // null = all
  return visibleBodies(scene.index, box);
}

export function quadPath(ctx: CanvasRenderingContext2D, q: Float64Array, i: number) {
  const k = 8 * i;
  ctx.moveTo(q[k], q[k + 1]);
  ctx.lineTo(q[k + 2], q[k + 3]);
  ctx.lineTo(q[k + 4], q[k + 5]);
  ctx.lineTo(q[k + 6], q[k + 7]);
  ctx.closePath();
}

export function outlinePath(ctx: CanvasRenderingContext2D, pts: readonly { x: number; y: number }[]) {
  ctx.moveTo(pts[0].x, pts[0].y);
  for (let j = 1; j < pts.length; j++) ctx.lineTo(pts[j].x, pts[j].y);
  ctx.closePath();
}
