// Units, angles and 2-D affine maps. Branded number types keep millimetres, degrees and radians
// (and points of different frames) apart at compile time; at run time they are plain numbers.

declare const unitBrand: unique symbol;
export type Mm = number & { readonly [unitBrand]: 'mm' };
export type Deg = number & { readonly [unitBrand]: 'deg' };
export type Rad = number & { readonly [unitBrand]: 'rad' };

export const mm = (v: number): Mm => v as Mm;
export const deg = (v: number): Deg => v as Deg;

declare const frameBrand: unique symbol;
export type FrameName = 'design' | 'board' | 'panel' | 'bottom-panel' | 'machine';
/** A point in a named frame; mixing frames fails to compile. */
export type FramePoint<F extends FrameName> = { readonly x: Mm; readonly y: Mm } & {
  readonly [frameBrand]: F;
};
export const pointIn = <F extends FrameName>(_frame: F, x: number, y: number): FramePoint<F> =>
  ({ x, y }) as FramePoint<F>;

/** 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811) */
export const MM_PER_INCH = 25.4;
/** 1 mil = 0.001 in = 0.0254 mm (NIST SP 811) */
export const MM_PER_MIL = 0.0254;

export type LengthUnit = 'mm' | 'mil' | 'in';
export const MM_PER_UNIT: Readonly<Record<LengthUnit, number>> = {
  mm: 1,
  mil: MM_PER_MIL,
  in: MM_PER_INCH,
};

/**
 * v in `unit` → mm as v·254 / 10 (in) or v·254 / 10000 (mil): for values with a few decimals the
 * product is exact and the one division correctly rounded, so 550 mil gives 13.97, not
 * 13.969999999999999 (what v·0.0254 gives).
 */
export const toMm = (v: number, unit: LengthUnit): Mm =>
  (unit === 'mm' ? v : unit === 'mil' ? (v * 254) / 10000 : (v * 254) / 10) as Mm;

const DEG = Math.PI / 180;
export const degToRad = (d: Deg | number): Rad => (d * DEG) as Rad;
export const radToDeg = (r: Rad | number): Deg => (r / DEG) as Deg;

/** Angle in [0, 360); a value within 1e-9 of 360 (or of 0 from below) is 0; -0 is 0. */
export function normDeg(a: number): Deg {
  if (!Number.isFinite(a)) throw new RangeError(`angle must be finite, got ${a}`);
  let r = a % 360;
  if (r < 0) r += 360;
  if (r >= 360 - 1e-9 || r < 1e-12) r = 0;
  return r as Deg;
}

/** Angle in (-180, 180]. */
export function signedDeg(a: number): Deg {
  const n = normDeg(a);
  return (n > 180 ? n - 360 : n) as Deg;
}

/** cos and sin of an angle in degrees, exact at multiples of 90°. */
export function cosSinDeg(a: number): [number, number] {
  const n = normDeg(a);
  if (n === 0) return [1, 0];
  if (n === 90) return [0, 1];
  if (n === 180) return [-1, 0];
  if (n === 270) return [0, -1];
  const r = n * DEG;
  return [Math.cos(r), Math.sin(r)];
}

/** 2-D affine map X = a·x + b·y + tx, Y = c·x + d·y + ty. */
export interface Affine {
  a: number;
  b: number;
  c: number;
  d: number;
  tx: number;
  ty: number;
}

export const IDENTITY: Readonly<Affine> = Object.freeze({ a: 1, b: 0, c: 0, d: 1, tx: 0, ty: 0 });

export function applyAffine(m: Affine, x: number, y: number): { x: number; y: number } {
  return { x: m.a * x + m.b * y + m.tx, y: m.c * x + m.d * y + m.ty };
}

/** outer ∘ inner: first `inner`, then `outer`. */
export function composeAffine(outer: Affine, inner: Affine): Affine {
  return {
    a: outer.a * inner.a + outer.b * inner.c,
    b: outer.a * inner.b + outer.b * inner.d,
    c: outer.c * inner.a + outer.d * inner.c,
    d: outer.c * inner.b + outer.d * inner.d,
    tx: outer.a * inner.tx + outer.b * inner.ty + outer.tx,
    ty: outer.c * inner.tx + outer.d * inner.ty + outer.ty,
  };
}

/** Rotation by `angle` degrees about the origin, then translation. */
export function rotationAffine(angle: number, tx = 0, ty = 0): Affine {
  const [c, s] = cosSinDeg(angle);
  return { a: c, b: -s, c: s, d: c, tx, ty };
}

/** Angle of the transformed X axis, [0, 360). */
export function affineRotationDeg(m: Affine): Deg {
  return normDeg(radToDeg(Math.atan2(m.c, m.a)));
}

export function affineToMatrix(m: Affine): [[number, number, number], [number, number, number]] {
  return [
    [m.a, m.b, m.tx],
    [m.c, m.d, m.ty],
  ];
}

export function affineDeterminant(m: Affine): number {
  return m.a * m.d - m.b * m.c;
}

export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Corners of a W × H rectangle with lower-left at (0, 0), mapped: (0,0), (W,0), (W,H), (0,H). */
export function mapRect(
  m: Affine,
  w: number,
  h: number,
): [{ x: number; y: number }, { x: number; y: number }, { x: number; y: number }, { x: number; y: number }] {
  return [applyAffine(m, 0, 0), applyAffine(m, w, 0), applyAffine(m, w, h), applyAffine(m, 0, h)];
}

export function boundsOf(points: ReadonlyArray<{ x: number; y: number }>): Box {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const p of points) {
    if (p.x < minX) minX = p.x;
    if (p.y < minY) minY = p.y;
    if (p.x > maxX) maxX = p.x;
    if (p.y > maxY) maxY = p.y;
  }
  return { minX, minY, maxX, maxY };
}
