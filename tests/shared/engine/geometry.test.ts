import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import {
  MM_PER_INCH,
  MM_PER_MIL,
  affineRotationDeg,
  applyAffine,
  composeAffine,
  cosSinDeg,
  normDeg,
  rotationAffine,
  signedDeg,
  toMm,
} from '../../../shared/geometry';

describe('units', () => {
  test('1 in = 25.4 mm exactly (NIST SP 811)', () => {
    expect(MM_PER_INCH).toBe(25.4);
    expect(toMm(2, 'in')).toBeCloseTo(50.8, 12);
  });
  test('1 mil = 0.001 in = 0.0254 mm (NIST SP 811)', () => {
    expect(MM_PER_MIL).toBeCloseTo(MM_PER_INCH / 1000, 15);
    // 1250 mil = 1.25 in = 31.75 mm
    expect(toMm(1250, 'mil')).toBeCloseTo(31.75, 12);
  });
  test('mm is identity', () => expect(toMm(12.5, 'mm')).toBe(12.5));
});

describe('normDeg', () => {
  test.each([
    [0, 0],
    [360, 0],
    [-90, 270],
    [450, 90],
    [-360, 0],
    [359.9999999999, 0], // within 1e-9 of 360
    [359.99, 359.99],
    [-0, 0],
    [720.5, 0.5],
  ])('normDeg(%s) = %s', (a, want) => {
    const r = normDeg(a);
    expect(r).toBeCloseTo(want, 9);
    expect(Object.is(r, -0)).toBe(false);
  });
  test('rejects non-finite angles', () => expect(() => normDeg(NaN)).toThrow(/finite/));
  test('idempotent and in [0, 360)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (a) => {
        const n = normDeg(a);
        expect(n).toBeGreaterThanOrEqual(0);
        expect(n).toBeLessThan(360);
        expect(normDeg(n)).toBe(n);
      }),
    );
  });
  test.each([
    [190, -170],
    [180, 180],
    [-179, -179],
    [359, -1],
  ])('signedDeg(%s) = %s', (a, want) => expect(signedDeg(a)).toBeCloseTo(want, 9));
});

describe('affine', () => {
  test('cos/sin exact at right angles', () => {
    expect(cosSinDeg(90)).toEqual([0, 1]);
    expect(cosSinDeg(180)).toEqual([-1, 0]);
    expect(cosSinDeg(-90)).toEqual([0, -1]);
  });
  test('compose applies inner first', () => {
    const inner = rotationAffine(90); // (1, 0) → (0, 1)
    const outer = { a: 1, b: 0, c: 0, d: 1, tx: 10, ty: 0 };
    const p = applyAffine(composeAffine(outer, inner), 1, 0);
    expect(p.x).toBeCloseTo(10, 12);
    expect(p.y).toBeCloseTo(1, 12);
  });
  test('rotation angle of the transformed X axis', () => {
    expect(affineRotationDeg(rotationAffine(30))).toBeCloseTo(30, 9);
    expect(affineRotationDeg(rotationAffine(-30))).toBeCloseTo(330, 9);
  });
});

describe('unit conversion keeps short decimals short', () => {
  test.each([
    [550, 'mil', 13.97], // 550 × 0.0254 = 13.97 (NIST SP 811: 1 mil = 0.0254 mm)
    [1250.5, 'mil', 31.7627], // 1250.5 × 0.0254
    [0.1, 'in', 2.54], // 0.1 × 25.4 (NIST SP 811: 1 in = 25.4 mm)
    [3.3, 'in', 83.82],
  ] as const)('%s %s = %s mm exactly as written', (v, u, mmv) => {
    expect(toMm(v, u)).toBe(mmv);
  });
});
