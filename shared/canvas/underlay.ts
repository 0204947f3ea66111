// Image underlay alignment: two point pairs (image pixel → output-frame mm) fitted with the
// engine's similarity fit (shared/fiducials, the same fit the fiducial transform uses).
//
// Image pixels run X right, Y DOWN; the output frame runs Y UP. A similarity (rotation + uniform
// scale + translation) cannot mirror, so the image's Y is negated first:
//   T_image(u, v) = S(u, −v), with S the similarity fitted from (u, −v) to the panel points.
import { applyAffine, composeAffine, type Affine } from '../geometry';
import { fitTransform, transformToAffine } from '../fiducials';
import type { XY } from '../core';

const FLIP_Y: Affine = { a: 1, b: 0, c: 0, d: -1, tx: 0, ty: 0 };

export interface UnderlayFit {
  /** image pixel (u right, v down) → output frame mm */
  transform: Affine;
  /** mm per image pixel */
  scale: number;
  /** rotation of the image's X axis in the output frame, deg [0, 360) */
  rotationDeg: number;
}

/**
 * Two-point (or more: least squares) similarity from image points to panel points. Throws an
 * Error with a plain message when the image points coincide.
 */
export function fitUnderlay(image: readonly XY[], panel: readonly XY[]): UnderlayFit {
  if (image.length !== panel.length || image.length < 2) {
    throw new Error(`underlay alignment needs two or more point pairs, got ${Math.min(image.length, panel.length)}`);
  }
  const flipped = image.map((p) => ({ x: p.x, y: -p.y }));
  let t;
  try {
    // the limits only produce warnings; an image's scale is nowhere near 1, so silence them
    t = fitTransform(flipped, panel, 'similarity', { limits: { residual: Infinity, scalePpm: Infinity, rotationDeg: Infinity }, context: 'underlay points' });
  } catch (e) {
    throw new Error(`the two image points are at one spot; pick two points far apart (${(e as Error).message})`);
  }
  const S = transformToAffine(t);
  return { transform: composeAffine(S, FLIP_Y), scale: t.scale, rotationDeg: t.rotationDeg };
}

export function invertAffine(m: Affine): Affine {
  const det = m.a * m.d - m.b * m.c;
  if (Math.abs(det) < 1e-300) throw new Error('invertAffine: singular transform');
  const a = m.d / det, b = -m.b / det, c = -m.c / det, d = m.a / det;
  return { a, b, c, d, tx: -(a * m.tx + b * m.ty), ty: -(c * m.tx + d * m.ty) };
}

/** A starting placement for a fresh image: its width spans `box` width, lower-left on the box's
 * lower-left corner, upright. */
export function initialUnderlay(imageWidth: number, imageHeight: number, box: { minX: number; minY: number; maxX: number; maxY: number }): Affine {
  const k = (box.maxX - box.minX) / Math.max(imageWidth, 1);
  // (0, imageHeight) (bottom-left pixel) → (minX, minY); v down → y up
  return { a: k, b: 0, c: 0, d: -k, tx: box.minX, ty: box.minY + k * imageHeight };
}

export { applyAffine };
