import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { Matrix, SingularValueDecomposition, determinant } from 'ml-matrix';
import { areCollinear, fitTransform, transformToAffine } from '../../../shared/fiducials';
import { applyAffine, type Affine } from '../../../shared/geometry';
import { EngineInputError } from '../../../shared/core';
import type { XY } from '../../../shared/core';

const pt = fc.record({ x: fc.double({ min: -300, max: 300, noNaN: true }), y: fc.double({ min: -300, max: 300, noNaN: true }) });

/** spread-out, non-collinear point sets (at least 3 points, triangle area > 100 mm²) */
const pointSet = fc.array(pt, { minLength: 3, maxLength: 8 }).filter((ps) => {
  for (let i = 2; i < ps.length; i++) {
    const a = ps[0], b = ps[1], c = ps[i];
    if (Math.abs((b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x)) / 2 > 100) return true;
  }
  return false;
});

const similarity = (rotDeg: number, s: number, tx: number, ty: number): Affine => {
  const r = (rotDeg * Math.PI) / 180;
  return { a: s * Math.cos(r), b: -s * Math.sin(r), c: s * Math.sin(r), d: s * Math.cos(r), tx, ty };
};
const mapAll = (T: Affine, ps: XY[]) => ps.map((p) => applyAffine(T, p.x, p.y));

/**
 * Independent Umeyama 1991 (general form: covariance, SVD, sign correction S), with ml-matrix.
 * Returns [c·R | t] for 2-D point sets.
 */
function umeyamaSvd(p: XY[], m: XY[], withScale: boolean): Affine {
  const n = p.length;
  const mp = [p.reduce((s, q) => s + q.x, 0) / n, p.reduce((s, q) => s + q.y, 0) / n];
  const mm = [m.reduce((s, q) => s + q.x, 0) / n, m.reduce((s, q) => s + q.y, 0) / n];
  let varP = 0;
  const cov = new Matrix(2, 2);
  for (let i = 0; i < n; i++) {
    const px = p[i].x - mp[0], py = p[i].y - mp[1];
    const qx = m[i].x - mm[0], qy = m[i].y - mm[1];
    varP += (px * px + py * py) / n;
    cov.set(0, 0, cov.get(0, 0) + (qx * px) / n);
    cov.set(0, 1, cov.get(0, 1) + (qx * py) / n);
    cov.set(1, 0, cov.get(1, 0) + (qy * px) / n);
    cov.set(1, 1, cov.get(1, 1) + (qy * py) / n);
  }
  const svd = new SingularValueDecomposition(cov);
  const U = svd.leftSingularVectors, V = svd.rightSingularVectors, D = svd.diagonal;
  const S = Matrix.eye(2);
  if (determinant(U) * determinant(V) < 0) S.set(1, 1, -1);
  const R = U.mmul(S).mmul(V.transpose());
  const c = withScale ? (D[0] * S.get(0, 0) + D[1] * S.get(1, 1)) / varP : 1;
  const tx = mm[0] - c * (R.get(0, 0) * mp[0] + R.get(0, 1) * mp[1]);
  const ty = mm[1] - c * (R.get(1, 0) * mp[0] + R.get(1, 1) * mp[1]);
  return { a: c * R.get(0, 0), b: c * R.get(0, 1), c: c * R.get(1, 0), d: c * R.get(1, 1), tx, ty };
}

describe('exact recovery (property)', () => {
  test('similarity fitted to exactly transformed points recovers rotation, scale, translation (Umeyama 1991)', () => {
    fc.assert(
      fc.property(pointSet, fc.double({ min: -179, max: 179, noNaN: true }), fc.double({ min: 0.9, max: 1.1, noNaN: true }),
        fc.double({ min: -200, max: 200, noNaN: true }), fc.double({ min: -200, max: 200, noNaN: true }),
        (ps, rot, s, tx, ty) => {
          const T = similarity(rot, s, tx, ty);
          const r = fitTransform(ps, mapAll(T, ps), 'similarity');
          expect(r.scale).toBeCloseTo(s, 9);
          expect(r.tx).toBeCloseTo(tx, 6);
          expect(r.ty).toBeCloseTo(ty, 6);
          const want = ((rot % 360) + 360) % 360;
          const diff = Math.abs(((r.rotationDeg - want + 540) % 360) - 180);
          expect(diff).toBeLessThan(1e-7);
          expect(r.rmsResidual).toBeLessThan(1e-6);
        }),
      { numRuns: 150 },
    );
  });
  test('rigid recovers a rotation + translation with scale exactly 1', () => {
    fc.assert(
      fc.property(pointSet, fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), (ps, rot, t) => {
        const T = similarity(rot, 1, t, -t);
        const r = fitTransform(ps, mapAll(T, ps), 'rigid');
        expect(r.scale).toBeCloseTo(1, 12);
        const got = transformToAffine(r);
        for (const k of ['a', 'b', 'c', 'd'] as const) expect(got[k]).toBeCloseTo(T[k], 9);
        expect(got.tx).toBeCloseTo(t, 6);
      }),
      { numRuns: 100 },
    );
  });
  test('affine recovers all six parameters', () => {
    fc.assert(
      fc.property(pointSet, fc.tuple(...Array.from({ length: 4 }, () => fc.double({ min: -0.2, max: 0.2, noNaN: true })), fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true })),
        (ps, [e1, e2, e3, e4, tx, ty]) => {
          const T: Affine = { a: 1 + e1, b: e2, c: e3, d: 1 + e4, tx, ty };
          const r = fitTransform(ps, mapAll(T, ps), 'affine');
          const got = transformToAffine(r);
          for (const k of ['a', 'b', 'c', 'd'] as const) expect(got[k]).toBeCloseTo(T[k], 7);
          expect(got.tx).toBeCloseTo(tx, 5);
          expect(got.ty).toBeCloseTo(ty, 5);
        }),
      { numRuns: 100 },
    );
  });
  test('translation from one point', () => {
    const r = fitTransform([{ x: 3, y: 4 }], [{ x: 13, y: 2 }], 'auto');
    expect(r.model).toBe('translation');
    expect([r.tx, r.ty]).toEqual([10, -2]);
    expect(r.warnings.map((w) => w.code)).toContain('transform-translation-only');
  });
});

describe('similarity against an independent SVD (Umeyama 1991, ml-matrix)', () => {
  test('noisy random point sets: same parameters as the general SVD form', () => {
    fc.assert(
      fc.property(pointSet, fc.array(fc.double({ min: -0.5, max: 0.5, noNaN: true }), { minLength: 16, maxLength: 16 }),
        fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: 0.5, max: 2, noNaN: true }), (ps, noise, rot, s) => {
          const m = mapAll(similarity(rot, s, 7, -3), ps).map((q, i) => ({ x: q.x + noise[2 * i], y: q.y + noise[2 * i + 1] }));
          for (const withScale of [true, false]) {
            const ours = transformToAffine(fitTransform(ps, m, withScale ? 'similarity' : 'rigid'));
            const ref = umeyamaSvd(ps, m, withScale);
            for (const k of ['a', 'b', 'c', 'd'] as const) expect(ours[k]).toBeCloseTo(ref[k], 7);
            expect(ours.tx).toBeCloseTo(ref.tx, 5);
            expect(ours.ty).toBeCloseTo(ref.ty, 5);
          }
        }),
      { numRuns: 100 },
    );
  });
});

describe('models, residuals and warnings', () => {
  const design = [{ x: 0, y: 0 }, { x: 200, y: 0 }, { x: 0, y: 100 }, { x: 150, y: 90 }];
  test('auto picks by count: 1 translation, 2 similarity, 3+ affine', () => {
    const m = design.map((p) => ({ x: p.x + 1, y: p.y + 2 }));
    expect(fitTransform(design.slice(0, 1), m.slice(0, 1), 'auto').model).toBe('translation');
    expect(fitTransform(design.slice(0, 2), m.slice(0, 2), 'auto').model).toBe('similarity');
    expect(fitTransform(design.slice(0, 3), m.slice(0, 3), 'auto').model).toBe('affine');
  });
  test('auto on collinear points falls back to similarity with a warning', () => {
    const line = [{ x: 0, y: 0 }, { x: 50, y: 50 }, { x: 100, y: 100 }];
    const r = fitTransform(line, line, 'auto');
    expect(r.model).toBe('similarity');
    expect(r.warnings.map((w) => w.code)).toContain('transform-collinear');
  });
  test('explicit affine on collinear points is a clear error', () => {
    const line = [{ x: 0, y: 0 }, { x: 50, y: 50 }, { x: 100, y: 100 }];
    let e: unknown;
    try {
      fitTransform(line, line, 'affine', { names: ['A', 'B', 'C'], file: 'job.json' });
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(EngineInputError);
    expect((e as EngineInputError).code).toBe('collinear-fiducials');
    expect((e as EngineInputError).message).toMatch(/A, B, C lie on one line/);
  });
  test('too few points for the model', () => {
    expect(() => fitTransform([{ x: 0, y: 0 }], [{ x: 0, y: 0 }], 'rigid')).toThrow(/at least 2/);
    expect(() => fitTransform(design.slice(0, 2), design.slice(0, 2), 'affine')).toThrow(/at least 3/);
  });
  test('coincident points cannot fix a rotation', () => {
    expect(() => fitTransform([{ x: 1, y: 1 }, { x: 1, y: 1 }], [{ x: 1, y: 1 }, { x: 2, y: 2 }], 'similarity')).toThrow(/one spot/);
  });
  test('collinearity test', () => {
    expect(areCollinear([{ x: 0, y: 0 }, { x: 1, y: 1 }, { x: 2, y: 2.0000000001 }])).toBe(true);
    expect(areCollinear([{ x: 0, y: 0 }, { x: 100, y: 0 }, { x: 0, y: 1 }])).toBe(false);
  });
  test('residual is T(design) − measured; RMS is √(mean d²)', () => {
    // translation fit of two points: t = mean offset = (1, 0); residuals ±(0.1, 0)
    const r = fitTransform([{ x: 0, y: 0 }, { x: 10, y: 0 }], [{ x: 0.9, y: 0 }, { x: 11.1, y: 0 }], 'translation');
    expect(r.tx).toBeCloseTo(1, 12);
    expect(r.residuals[0].dx).toBeCloseTo(0.1, 12); // 0 + 1 − 0.9
    expect(r.residuals[1].dx).toBeCloseTo(-0.1, 12); // 10 + 1 − 11.1
    expect(r.rmsResidual).toBeCloseTo(0.1, 12);
    expect(r.warnings.filter((w) => w.code === 'transform-residual')).toHaveLength(2); // 0.1 > 0.05 mm
  });
  test('limits are configurable', () => {
    const r = fitTransform([{ x: 0, y: 0 }, { x: 10, y: 0 }], [{ x: 0.9, y: 0 }, { x: 11.1, y: 0 }], 'translation', { limits: { residual: 0.2 } });
    expect(r.warnings.filter((w) => w.code === 'transform-residual')).toHaveLength(0);
  });
  test('rotation and scale warnings (signed rotation in (−180, 180])', () => {
    const T = similarity(-3, 1.002, 0, 0);
    const r = fitTransform(design, mapAll(T, design), 'similarity');
    expect(r.rotationDeg).toBeCloseTo(357, 9);
    expect(r.scalePpm).toBeCloseTo(2000, 3);
    expect(r.warnings.map((w) => w.code).sort()).toEqual(['transform-rotation', 'transform-scale']);
    const ok = fitTransform(design, mapAll(similarity(-1, 1.0005, 0, 0), design), 'similarity');
    expect(ok.warnings).toHaveLength(0);
  });
  test('affine shear is reported', () => {
    // X axis stays, Y axis leans by 1°: b = tan(1°); angle between axes = 89°, shear 1°
    const T: Affine = { a: 1, b: Math.tan(Math.PI / 180), c: 0, d: 1, tx: 0, ty: 0 };
    const r = fitTransform(design, mapAll(T, design), 'affine');
    expect(r.shearDeg).toBeCloseTo(1, 9);
  });
});
