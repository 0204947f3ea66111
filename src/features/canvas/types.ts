import type { Affine } from '../../../shared/geometry';
import type { Side, XY } from '../../../shared/core';
export type { CanvasNote } from './draw';

/** An image under the drawing, placed by an image-pixel → output-frame transform. The lead stores
 * it with the revision; the canvas reports changes through `onUnderlayChange`. */
export interface UnderlayState {
  side: Side;
  /** object URL (or any URL the browser can load) */
  url: string;
  name: string;
  /** image size, px */
  width: number;
  height: number;
  /** image pixel (u right, v down) → output frame mm */
  transform: Affine;
  /** 0…1 */
  opacity: number;
  /** the point pairs of the last two-point alignment (image px, output frame mm) */
  pairs?: { image: XY[]; panel: XY[] };
}

/** A new comment pinned on the canvas. */
export interface NewNote {
  side: Side;
  /** output frame of that side, mm */
  x: number;
  y: number;
  text: string;
}
