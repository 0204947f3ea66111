import { describe, expect, it } from 'vitest';
import { applyAffine } from '../../../shared/geometry';
import { fitUnderlay, initialUnderlay, invertAffine } from '../../../shared/canvas/underlay';

describe('two-point similarity for the image underlay', () => {
  it('hand-worked: image (0,0)→(10,20), (100,0)→(10,70)', () => {
    // Negate the image Y: p1 = (0, 0), p2 = (100, 0). Panel q1 = (10, 20), q2 = (10, 70).
    // Direction p2 − p1 = (100, 0), q2 − q1 = (0, 50): scale 50 / 100 = 0.5, rotation +90°.
    // S(x, y) = 0.5·(−y, x) + (10, 20); T(u, v) = S(u, −v) = (0.5·v + 10, 0.5·u + 20)
    // → a = 0, b = 0.5, c = 0.5, d = 0, tx = 10, ty = 20.
    const f = fitUnderlay([{ x: 0, y: 0 }, { x: 100, y: 0 }], [{ x: 10, y: 20 }, { x: 10, y: 70 }]);
    const t = f.transform;
    for (const [k, v] of Object.entries({ a: 0, b: 0.5, c: 0.5, d: 0, tx: 10, ty: 20 })) expect(t[k as keyof typeof t]).toBeCloseTo(v, 12);
    expect(f.scale).toBeCloseTo(0.5, 12);
    expect(f.rotationDeg).toBeCloseTo(90, 9);
    // a third image point (0, 40) (40 px below the first) → (0.5·40 + 10, 20) = (30, 20)
    const p = applyAffine(t, 0, 40);
    expect(p.x).toBeCloseTo(30, 12);
    expect(p.y).toBeCloseTo(20, 12);
  });

  it('hand-worked: an upright photo at 0.1 mm/px with the board corner at pixel (50, 850)', () => {
    // image (50, 850) → panel (0, 0); image (1050, 850) → panel (100, 0): scale 100 / 1000 = 0.1,
    // no rotation. T(u, v) = (0.1·u − 5, −0.1·v + 85): (50, 850) → (0, 0) ✓; (50, 50) → (0, 80).
    const f = fitUnderlay([{ x: 50, y: 850 }, { x: 1050, y: 850 }], [{ x: 0, y: 0 }, { x: 100, y: 0 }]);
    expect(f.scale).toBeCloseTo(0.1, 12);
    expect(f.rotationDeg).toBeCloseTo(0, 9);
    const p = applyAffine(f.transform, 50, 50);
    expect(p.x).toBeCloseTo(0, 9);
    expect(p.y).toBeCloseTo(80, 9);
  });

  it('refuses two image points at one spot', () => {
    expect(() => fitUnderlay([{ x: 5, y: 5 }, { x: 5, y: 5 }], [{ x: 0, y: 0 }, { x: 10, y: 0 }])).toThrow(/one spot/);
  });

  it('inverse round trip and initial placement', () => {
    const t = initialUnderlay(1000, 500, { minX: 0, minY: 0, maxX: 200, maxY: 100 });
    // bottom-left pixel (0, 500) → (0, 0); top-right pixel (1000, 0) → (200, 100)
    expect(applyAffine(t, 0, 500)).toEqual({ x: 0, y: 0 });
    expect(applyAffine(t, 1000, 0)).toEqual({ x: 200, y: 100 });
    const inv = invertAffine({ a: 0.3, b: -0.7, c: 0.9, d: 0.2, tx: 4, ty: -3 });
    const back = applyAffine(inv, ...(Object.values(applyAffine({ a: 0.3, b: -0.7, c: 0.9, d: 0.2, tx: 4, ty: -3 }, 12, 34)) as [number, number]));
    expect(back.x).toBeCloseTo(12, 9);
    expect(back.y).toBeCloseTo(34, 9);
  });
});
