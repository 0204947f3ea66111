import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { applyAffine, boundsOf, mapRect } from '../../../shared/geometry';
import { boardInstances, instanceAffine, sideAffine, sideRotationTerm } from '../../../shared/panel';
import { jobSchema } from '../../../shared/schemas/job.schema';
import { EngineInputError } from '../../../shared/core';

const W = 60, H = 40;
const A = { anchorX: 5, anchorY: 7 };

describe('step-and-repeat at right angles (shared/README.md, "Step-and-repeat" table)', () => {
  // board 60 × 40, anchor A = (5, 7), point (u, v) = (10, 3)
  test.each([
    // φ = 0: A + (u, v) = (5 + 10, 7 + 3) = (15, 10)
    [0, 15, 10],
    // φ = 90: A + (H − v, u) = (5 + 40 − 3, 7 + 10) = (42, 17)
    [90, 42, 17],
    // φ = 180: A + (W − u, H − v) = (5 + 60 − 10, 7 + 40 − 3) = (55, 44)
    [180, 55, 44],
    // φ = 270: A + (v, W − u) = (5 + 3, 7 + 60 − 10) = (8, 57)
    [270, 8, 57],
  ])('φ = %s → (%s, %s)', (phi, x, y) => {
    const p = applyAffine(instanceAffine({ ...A, rotation: phi }, W, H), 10, 3);
    expect(p.x).toBeCloseTo(x, 12);
    expect(p.y).toBeCloseTo(y, 12);
    // part rotation θ + φ (top side)
    expect(sideRotationTerm('top', 'vertical', phi)).toBe(phi);
  });
  test('any angle: the rotated board\'s bounding box has its lower-left on the anchor', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }), (phi) => {
        const M = instanceAffine({ ...A, rotation: phi }, W, H);
        const b = boundsOf(mapRect(M, W, H));
        expect(b.minX).toBeCloseTo(5, 9);
        expect(b.minY).toBeCloseTo(7, 9);
      }),
    );
  });
  test('30°: worked example', () => {
    // corners rotated by 30°: (0,0), (51.96, 30), (31.96, 64.64), (−20, 34.64); min = (−20, 0)
    // so (u, v) = (0, 0) lands at A + (20, 0) = (25, 7)
    const p = applyAffine(instanceAffine({ ...A, rotation: 30 }, W, H), 0, 0);
    expect(p.x).toBeCloseTo(25, 9);
    expect(p.y).toBeCloseTo(7, 9);
  });
  test('step-out at 0/90/180/270 keeps pairwise distances (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(0, 90, 180, 270),
        fc.array(fc.record({ u: fc.double({ min: 0, max: W, noNaN: true }), v: fc.double({ min: 0, max: H, noNaN: true }) }), { minLength: 2, maxLength: 10 }),
        (phi, pts) => {
          const M = instanceAffine({ anchorX: 11, anchorY: -3, rotation: phi }, W, H);
          const q = pts.map((p) => applyAffine(M, p.u, p.v));
          for (let i = 1; i < pts.length; i++) {
            const d0 = Math.hypot(pts[i].u - pts[0].u, pts[i].v - pts[0].v);
            const d1 = Math.hypot(q[i].x - q[0].x, q[i].y - q[0].y);
            expect(d1).toBeCloseTo(d0, 9);
          }
        },
      ),
    );
  });
});

describe('bottom side flips (shared/README.md, "Rotation and the bottom side")', () => {
  // panel 140 × 100, top-view panel position P = (30, 20), φ = 90, θb = 10
  test('vertical flip: (PW − P.x, P.y), rotation θb − φ', () => {
    const p = applyAffine(sideAffine('bottom', 'vertical', 140, 100), 30, 20);
    expect([p.x, p.y]).toEqual([110, 20]); // 140 − 30
    expect(10 + sideRotationTerm('bottom', 'vertical', 90)).toBe(-80); // 10 − 90, normalised later to 280
  });
  test('horizontal flip: (P.x, PH − P.y), rotation θb − φ + 180', () => {
    const p = applyAffine(sideAffine('bottom', 'horizontal', 140, 100), 30, 20);
    expect([p.x, p.y]).toEqual([30, 80]); // 100 − 20
    expect(10 + sideRotationTerm('bottom', 'horizontal', 90)).toBe(100); // 10 − 90 + 180
  });
  test('the two flips differ by a half turn', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 140, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), (x, y) => {
        const v = applyAffine(sideAffine('bottom', 'vertical', 140, 100), x, y);
        const h = applyAffine(sideAffine('bottom', 'horizontal', 140, 100), x, y);
        // rotating the vertical-flip frame by 180° about the panel centre gives the horizontal one
        expect(140 - v.x).toBeCloseTo(h.x, 9);
        expect(100 - v.y).toBeCloseTo(h.y, 9);
      }),
    );
  });
});

describe('grid numbering, cell rotations, skips', () => {
  const panel = jobSchema.shape.panel.parse({
    width: 140, height: 100,
    grid: { rows: 2, cols: 2, pitchX: 65, pitchY: 45, offsetX: 5, offsetY: 5, rotation: 0,
      cellRotations: [{ row: 0, col: 1, rotation: 180 }], skip: [{ row: 1, col: 1 }] },
  });
  test('n = row·cols + col + 1 from the bottom-left, anchors from pitch and offset', () => {
    const b = boardInstances(panel);
    expect(b.map((i) => [i.number, i.row, i.col, i.anchorX, i.anchorY, i.rotation, i.skipped])).toEqual([
      [1, 0, 0, 5, 5, 0, false],
      [2, 0, 1, 70, 5, 180, false], // 5 + 1·65
      [3, 1, 0, 5, 50, 0, false], // 5 + 1·45
      [4, 1, 1, 70, 50, 0, true],
    ]);
  });
  test('explicit instances are numbered in order', () => {
    const p = jobSchema.shape.panel.parse({ width: 100, height: 100, instances: [{ x: 1, y: 2 }, { x: 50, y: 2, rotation: -90, skip: true }] });
    expect(boardInstances(p).map((i) => [i.number, i.anchorX, i.rotation, i.skipped])).toEqual([[1, 1, 0, false], [2, 50, 270, true]]);
  });
  test('a cell outside the grid is an error naming the field', () => {
    const p = jobSchema.shape.panel.parse({ width: 100, height: 100, grid: { rows: 1, cols: 2, pitchX: 50, pitchY: 0, skip: [{ row: 0, col: 0 }, { row: 0, col: 2 }] } });
    let e: unknown;
    try {
      boardInstances(p, 'job.json');
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(EngineInputError);
    expect((e as EngineInputError).field).toBe('panel.grid.skip[1]');
  });
  test('grid and instances together are refused', () => {
    const r = jobSchema.shape.panel.safeParse({ width: 1, height: 1, grid: { rows: 1, cols: 1, pitchX: 0, pitchY: 0 }, instances: [{ x: 0, y: 0 }] });
    expect(r.success).toBe(false);
  });
});
