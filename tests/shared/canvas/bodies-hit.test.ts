import { describe, expect, it } from 'vitest';
import { bodyQuads, pinOneMarks, pinOneStyle, quadBoxes } from '../../../shared/canvas/bodies';
import { buildBodyIndex, hitBox, hitBoxBruteForTest, hitPoint, hitPointBrute } from './helpers';
import { allocatePlacementColumns } from '../../../shared/core';

function cols(parts: { x: number; y: number; rot: number; L: number; W: number; pkg?: string; cy?: number }[]) {
  const p = allocatePlacementColumns(parts.length);
  parts.forEach((q, i) => {
    p.x[i] = q.x; p.y[i] = q.y; p.rotation[i] = q.rot; p.bodyLength[i] = q.L; p.bodyWidth[i] = q.W;
    p.packageName[i] = q.pkg ?? 'R0603'; p.courtyard[i] = q.cy ?? 0.25; p.ref[i] = `R${i + 1}`;
  });
  return p;
}

describe('body quads', () => {
  it('turns an R0603 body (1.6 × 0.8) by 90° about its centre', () => {
    // half extents 0.8 × 0.4; at 90° the length runs along Y: corners (10 ± 0.4, 20 ± 0.8)
    const q = bodyQuads(cols([{ x: 10, y: 20, rot: 90, L: 1.6, W: 0.8 }]));
    const pts = [0, 2, 4, 6].map((k) => [Number(q[k].toFixed(9)), Number(q[k + 1].toFixed(9))]);
    expect(pts).toEqual([[10.4, 19.2], [10.4, 20.8], [9.6, 20.8], [9.6, 19.2]]);
    const b = quadBoxes(q);
    expect(Array.from(b).map((v) => Number(v.toFixed(9)))).toEqual([9.6, 19.2, 10.4, 20.8]);
  });

  it('grows the courtyard by the excess on every side', () => {
    // 1.6 × 0.8 grown by 0.25 → 2.1 × 1.3 at 0°: x 10 ± 1.05, y 20 ± 0.65
    const b = quadBoxes(bodyQuads(cols([{ x: 10, y: 20, rot: 0, L: 1.6, W: 0.8, cy: 0.25 }]), true));
    expect(Array.from(b).map((v) => Number(v.toFixed(9)))).toEqual([8.95, 19.35, 11.05, 20.65]);
  });

  it('an unmatched part is a 0.5 mm point body', () => {
    const p = cols([{ x: 1, y: 1, rot: 0, L: NaN, W: NaN }]);
    expect(Array.from(quadBoxes(bodyQuads(p)))).toEqual([0.75, 0.75, 1.25, 1.25]);
  });
});

describe('pin-1 marks (IPC-7351B zero orientation, from memory)', () => {
  it.each([
    ['R0603', 'end'], ['C0402', 'end'], ['LED0603', 'end'], ['SOD-123', 'end'], ['SMA', 'end'], ['ECAP-6.3x5.8', 'end'], ['IND-4x4', 'end'],
    ['SOT-23', 'corner'], ['SOIC-8', 'corner'], ['QFN-32-5x5', 'corner'], ['XTAL-3225', 'corner'], ['HDR-1x4-2.0', 'corner'], ['SW-TACT-6x6', 'corner'], [null, 'corner'],
  ] as const)('%s has its pin 1 at the %s', (name, style) => {
    expect(pinOneStyle(name)).toBe(style);
  });

  it('a part turned by 180° shows its mark at the other end', () => {
    const m = pinOneMarks(cols([{ x: 0, y: 0, rot: 0, L: 1.6, W: 0.8 }, { x: 0, y: 0, rot: 180, L: 1.6, W: 0.8 }]));
    expect(m[0]).toBeLessThan(0); // left end at 0°
    expect(m[1]).toBeCloseTo(0, 12);
    expect(m[3]).toBeCloseTo(-m[0], 12); // right end at 180°
  });

  it('an IC at 0° has the mark at the upper left; at 90° at the lower left', () => {
    const m = pinOneMarks(cols([{ x: 0, y: 0, rot: 0, L: 4.9, W: 3.9, pkg: 'SOIC-8' }, { x: 0, y: 0, rot: 90, L: 4.9, W: 3.9, pkg: 'SOIC-8' }]));
    expect(m[0]).toBeLessThan(0);
    expect(m[1]).toBeGreaterThan(0);
    // turned 90° CCW the upper-left corner (−, +) goes to (−, −)
    expect(m[3]).toBeLessThan(0);
    expect(m[4]).toBeLessThan(0);
  });
});

describe('hit testing through the index agrees with brute force', () => {
  let seed = 12345;
  const rnd = () => ((seed = (seed * 48271) % 2147483647) / 2147483647);
  const parts = Array.from({ length: 3000 }, () => ({ x: rnd() * 100, y: rnd() * 60, rot: Math.floor(rnd() * 8) * 45 + (rnd() < 0.2 ? rnd() * 10 : 0), L: 0.4 + rnd() * 6, W: 0.2 + rnd() * 3 }));
  const p = cols(parts);
  const q = bodyQuads(p);
  const ix = buildBodyIndex(q, quadBoxes(q));

  it('point queries (600 random points, tolerances 0 and 0.3 mm)', () => {
    for (let k = 0; k < 600; k++) {
      const x = rnd() * 100, y = rnd() * 60, tol = k % 2 ? 0.3 : 0;
      expect(hitPoint(ix, x, y, tol)).toBe(hitPointBrute(ix, x, y, tol));
    }
  });

  it('a point inside a turned body hits it; just outside its corner misses', () => {
    const single = cols([{ x: 5, y: 5, rot: 45, L: 4, W: 1 }]);
    const sq = bodyQuads(single);
    const s = buildBodyIndex(sq, quadBoxes(sq));
    expect(hitPoint(s, 5, 5)).toBe(0);
    // the axis-aligned box corner (5 + 1.77, 5 + 1.77) is outside the turned rectangle
    expect(hitPoint(s, 6.7, 6.7)).toBe(-1);
    // 1.9 mm along the 45° length direction: inside (half length 2)
    expect(hitPoint(s, 5 + 1.9 * Math.SQRT1_2, 5 + 1.9 * Math.SQRT1_2)).toBe(0);
  });

  it('box queries select bodies whose centre is in the box', () => {
    for (let k = 0; k < 50; k++) {
      const x0 = rnd() * 100, y0 = rnd() * 60;
      const box = { minX: x0, minY: y0, maxX: x0 + rnd() * 30, maxY: y0 + rnd() * 20 };
      expect(hitBox(ix, box, p.x, p.y)).toEqual(hitBoxBruteForTest(p, box));
    }
  });
});
