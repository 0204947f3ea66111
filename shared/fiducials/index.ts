// Fiducial transform fitting (shared/README.md, "Fiducial transform"): translation, rigid, similarity (closed form of
// Umeyama 1991, IEEE TPAMI 13(4)) and affine (6-parameter linear least squares, mathjs lusolve).
import { lusolve } from 'mathjs';
import {
  affineRotationDeg,
  affineToMatrix,
  applyAffine,
  normDeg,
  radToDeg,
  signedDeg,
  type Affine,
} from '../geometry';
import { angleText, EngineInputError, fixed, lengthText } from '../core';
import type { EngineWarning, Residual, TransformChoice, TransformModel, TransformResult, XY } from '../core';

export interface AlignLimits {
  /** mm */
  residual: number;
  /** ppm */
  scalePpm: number;
  /** deg */
  rotationDeg: number;
}
export const DEFAULT_LIMITS: Readonly<AlignLimits> = Object.freeze({ residual: 0.05, scalePpm: 1000, rotationDeg: 2 });

export interface FitOptions {
  names?: readonly string[];
  limits?: Partial<AlignLimits>;
  /** error context (e.g. "fiducials (top)" or "board 3 local fiducials") */
  context?: string;
  file?: string;
}

/** relative eigenvalue ratio of the design scatter below which points count as collinear */
const COLLINEAR_RATIO = 1e-10;

interface Centred {
  n: number;
  pcx: number;
  pcy: number;
  mcx: number;
  mcy: number;
  /** Σ p'p'ᵀ entries */
  sxx: number;
  sxy: number;
  syy: number;
}

function centre(p: readonly XY[], m: readonly XY[]): Centred {
  const n = p.length;
  let pcx = 0, pcy = 0, mcx = 0, mcy = 0;
  for (let i = 0; i < n; i++) {
    pcx += p[i].x; pcy += p[i].y; mcx += m[i].x; mcy += m[i].y;
  }
  pcx /= n; pcy /= n; mcx /= n; mcy /= n;
  let sxx = 0, sxy = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    const x = p[i].x - pcx, y = p[i].y - pcy;
    sxx += x * x; sxy += x * y; syy += y * y;
  }
  return { n, pcx, pcy, mcx, mcy, sxx, sxy, syy };
}

/** True when the design points are (numerically) on one line or all at one spot. */
export function areCollinear(points: readonly XY[]): boolean {
  if (points.length < 3) return true;
  const c = centre(points, points);
  const tr = c.sxx + c.syy;
  if (tr <= 1e-18) return true;
  const det = c.sxx * c.syy - c.sxy * c.sxy;
  // λmin·λmax = det, λmin + λmax = tr → λmin/λmax ≈ det / tr² for a thin scatter
  return det / (tr * tr) < COLLINEAR_RATIO;
}

/** Rotation (and optional scale) in closed form, 2-D case of Umeyama 1991. */
function fitRotation(p: readonly XY[], m: readonly XY[], withScale: boolean): Affine {
  const c = centre(p, m);
  let a = 0, b = 0; // a = Σ p'·m', b = Σ p' × m'
  for (let i = 0; i < c.n; i++) {
    const px = p[i].x - c.pcx, py = p[i].y - c.pcy;
    const mx = m[i].x - c.mcx, my = m[i].y - c.mcy;
    a += px * mx + py * my;
    b += px * my - py * mx;
  }
  const varP = c.sxx + c.syy;
  const norm = Math.hypot(a, b);
  const cos = norm > 0 ? a / norm : 1;
  const sin = norm > 0 ? b / norm : 0;
  const s = withScale ? norm / varP : 1;
  const A = s * cos, B = -s * sin, C = s * sin, D = s * cos;
  return { a: A, b: B, c: C, d: D, tx: c.mcx - (A * c.pcx + B * c.pcy), ty: c.mcy - (C * c.pcx + D * c.pcy) };
}

function fitAffine(p: readonly XY[], m: readonly XY[]): Affine {
  const c = centre(p, m);
  let bxx = 0, bxy = 0, byx = 0, byy = 0; // Σ p'x m'x, Σ p'y m'x, Σ p'x m'y, Σ p'y m'y
  for (let i = 0; i < c.n; i++) {
    const px = p[i].x - c.pcx, py = p[i].y - c.pcy;
    const mx = m[i].x - c.mcx, my = m[i].y - c.mcy;
    bxx += px * mx; bxy += py * mx; byx += px * my; byy += py * my;
  }
  // normal equations on centred points: [[Sxx, Sxy], [Sxy, Syy]] · [a b]ᵀ = [Σx'X', Σy'X']ᵀ
  const N = [[c.sxx, c.sxy], [c.sxy, c.syy]];
  const ab = lusolve(N, [[bxx], [bxy]]) as number[][];
  const cd = lusolve(N, [[byx], [byy]]) as number[][];
  const a = ab[0][0], b = ab[1][0], cc = cd[0][0], d = cd[1][0];
  return { a, b, c: cc, d, tx: c.mcx - (a * c.pcx + b * c.pcy), ty: c.mcy - (cc * c.pcx + d * c.pcy) };
}

const MIN_POINTS: Record<TransformModel, number> = { translation: 1, rigid: 2, similarity: 2, affine: 3 };

/**
 * Fit design (panel frame) → measured (machine frame). Throws EngineInputError for too few points,
 * coincident points, or collinear points under an explicit `affine`.
 */
export function fitTransform(
  design: readonly XY[],
  measured: readonly XY[],
  choice: TransformChoice,
  opts: FitOptions = {},
): TransformResult {
  const ctx = opts.context ?? 'fiducials';
  const file = opts.file;
  if (design.length !== measured.length) {
    throw new RangeError(`fitTransform: ${design.length} design points but ${measured.length} measured points`);
  }
  const n = design.length;
  const names = opts.names ?? design.map((_, i) => `F${i + 1}`);
  const limits = { ...DEFAULT_LIMITS, ...opts.limits };
  const warnings: EngineWarning[] = [];
  if (n === 0) throw new EngineInputError(`${ctx}: no measured fiducial to fit a transform`, { file, field: 'fiducials', code: 'no-fiducials' });

  let model: TransformModel;
  if (choice === 'auto') {
    if (n === 1) model = 'translation';
    else if (n === 2) model = 'similarity';
    else if (areCollinear(design)) {
      model = 'similarity';
      warnings.push({ line: null, message: `${ctx}: the ${n} fiducials lie on one line; fitted a similarity instead of an affine transform`, code: 'transform-collinear' });
    } else model = 'affine';
  } else model = choice;

  if (n < MIN_POINTS[model]) {
    throw new EngineInputError(`${ctx}: a ${model} transform needs at least ${MIN_POINTS[model]} measured fiducials, got ${n}`, {
      file, field: 'transform', code: 'too-few-fiducials',
    });
  }
  if (n >= 2 && model !== 'translation') {
    const c = centre(design, design);
    if (c.sxx + c.syy < 1e-12) {
      throw new EngineInputError(`${ctx}: the fiducials ${names.join(', ')} are all at one spot; rotation cannot be fitted`, {
        file, field: 'fiducials', code: 'coincident-fiducials',
      });
    }
  }
  if (model === 'affine' && areCollinear(design)) {
    throw new EngineInputError(
      `${ctx}: the fiducials ${names.join(', ')} lie on one line and cannot fix an affine transform; add a fiducial off that line or use "similarity"`,
      { file, field: 'transform', code: 'collinear-fiducials' },
    );
  }
  if (n === 1) warnings.push({ line: null, message: `${ctx}: one fiducial: translation only, rotation is not corrected`, code: 'transform-translation-only' });

  let T: Affine;
  if (model === 'translation') {
    const c = centre(design, measured);
    T = { a: 1, b: 0, c: 0, d: 1, tx: c.mcx - c.pcx, ty: c.mcy - c.pcy };
  } else if (model === 'rigid') T = fitRotation(design, measured, false);
  else if (model === 'similarity') T = fitRotation(design, measured, true);
  else T = fitAffine(design, measured);

  return describeTransform(T, model, design, measured, names, limits, warnings, ctx);
}

/** Residuals, RMS, rotation, scale, shear and limit warnings of a fitted transform. */
export function describeTransform(
  T: Affine,
  model: TransformModel,
  design: readonly XY[],
  measured: readonly XY[],
  names: readonly string[],
  limits: AlignLimits = DEFAULT_LIMITS,
  warnings: EngineWarning[] = [],
  ctx = 'fiducials',
): TransformResult {
  const residuals: Residual[] = [];
  let sum = 0;
  for (let i = 0; i < design.length; i++) {
    const q = applyAffine(T, design[i].x, design[i].y);
    const dx = q.x - measured[i].x;
    const dy = q.y - measured[i].y;
    const distance = Math.hypot(dx, dy);
    sum += distance * distance;
    residuals.push({ name: names[i], dx, dy, distance });
    if (distance > limits.residual) {
      warnings.push({
        line: null,
        message: `${ctx}: fiducial ${names[i]} residual ${lengthText(distance, 4)} exceeds ${lengthText(limits.residual, 4)} (mis-measured or mis-named?)`,
        code: 'transform-residual',
      });
    }
  }
  const rmsResidual = design.length ? Math.sqrt(sum / design.length) : 0;
  const sx = Math.hypot(T.a, T.c);
  const sy = Math.hypot(T.b, T.d);
  const scale = model === 'affine' ? (sx + sy) / 2 : sx;
  const scalePpm = (scale - 1) * 1e6;
  const worstPpm = model === 'affine' ? Math.max(Math.abs(sx - 1), Math.abs(sy - 1)) * 1e6 : Math.abs(scalePpm);
  if (worstPpm > limits.scalePpm) {
    warnings.push({ line: null, message: `${ctx}: scale deviates by ${fixed(worstPpm, 0)} ppm, more than ${limits.scalePpm} ppm`, code: 'transform-scale' });
  }
  const rotationDeg = affineRotationDeg(T);
  const signed = signedDeg(rotationDeg);
  if (Math.abs(signed) > limits.rotationDeg) {
    warnings.push({ line: null, message: `${ctx}: rotation ${angleText(signed)} exceeds ${limits.rotationDeg}°`, code: 'transform-rotation' });
  }
  let shearDeg = 0;
  if (model === 'affine') {
    const between = radToDeg(Math.atan2(T.a * T.d - T.c * T.b, T.a * T.b + T.c * T.d));
    shearDeg = 90 - between;
  }
  return {
    model,
    matrix: affineToMatrix(T),
    rotationDeg: normDeg(rotationDeg),
    scale,
    scalePpm,
    shearDeg,
    tx: T.tx,
    ty: T.ty,
    residuals,
    rmsResidual,
    warnings,
  };
}

export function transformToAffine(t: TransformResult): Affine {
  const [[a, b, tx], [c, d, ty]] = t.matrix;
  return { a, b, c, d, tx, ty };
}
