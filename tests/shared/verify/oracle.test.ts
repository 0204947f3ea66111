// The exact overlap test of the findings engine against an independent oracle:
// polygon-clipping, an independent general-purpose polygon boolean library (Martinez-Rueda sweep
// line), computes the intersection polygon of the two turned rectangles; its area, with the same
// 1e-6 threshold, is the oracle's verdict. Thousands of random pairs (fast-check), through the
// engine's public entry point (verify) and through the geometry helpers it uses.
import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import polygonClipping, { type Polygon } from 'polygon-clipping';
import { verify } from '../../../shared/verify';
import { makeVerifyInput } from '../../../shared/verify/build';
import { TOUCH_EPS, TOUCH_EPS_AREA, rectSatDepth, rectIntersectionArea } from '../../../shared/verify/geom';

interface R {
  x: number;
  y: number;
  a: number;
  L: number;
  W: number;
}

/** Corners of a turned rectangle, computed here independently of the engine (closed ring); cos
 * and sin are exact at right angles so that 90° does not leave a 6e-17 tilt. */
function ring(r: R, grow = 0): Polygon {
  const t = (r.a * Math.PI) / 180;
  const right = r.a % 90 === 0;
  const c = right ? Math.round(Math.cos(t)) : Math.cos(t);
  const s = right ? Math.round(Math.sin(t)) : Math.sin(t);
  const hx = r.L / 2 + grow;
  const hy = r.W / 2 + grow;
  const pts: [number, number][] = [
    [-hx, -hy],
    [hx, -hy],
    [hx, hy],
    [-hx, hy],
  ].map(([u, v]) => [r.x + u * c - v * s, r.y + u * s + v * c]);
  return [[...pts, pts[0]]];
}

function shoelace(ringPts: [number, number][]): number {
  let a = 0;
  for (let i = 0; i + 1 < ringPts.length; i++) a += ringPts[i][0] * ringPts[i + 1][1] - ringPts[i + 1][0] * ringPts[i][1];
  return Math.abs(a) / 2;
}

let oracleFailures = 0;

/** The oracle: area of the intersection by polygon-clipping (null in the rare case where the
 * library itself gives up on a near-degenerate input; such cases are skipped and counted). */
function oracleArea(a: R, b: R, grow = 0): number | null {
  let mp;
  try {
    mp = polygonClipping.intersection(ring(a, grow), ring(b, grow));
  } catch {
    oracleFailures++;
    return null;
  }
  let area = 0;
  for (const poly of mp) {
    area += shoelace(poly[0] as [number, number][]);
    for (let h = 1; h < poly.length; h++) area -= shoelace(poly[h] as [number, number][]);
  }
  return area;
}

// Positions and sizes on a 0.01 mm grid (so exact contact happens often), sizes of real bodies
// (0.1 to 4 mm), angles either special (0, 90, 45, 30, ...) or arbitrary doubles.
const coord = fc.integer({ min: -300, max: 300 }).map((v) => v / 100);
const size = fc.integer({ min: 10, max: 400 }).map((v) => v / 100);
// An angle within 1e-6° of a right angle is generated as that right angle: the oracle's sweep line
// loses a cross of two bars when one is tilted by ~1e-16° (seen: a 3.8 × 0.1 bar at 1.05e-16°
// over a 0.96 × 0.1 bar at 60°, same centre, came back empty), a limit of the oracle, not a case
// the engine gets wrong.
const snap = (a: number): number => {
  const r = Math.round(a / 90) * 90;
  return Math.abs(a - r) < 1e-6 ? r % 360 : a;
};
const angle = fc.oneof(
  fc.constantFrom(0, 90, 180, 270, 45, 135, 30, 60),
  fc.double({ min: 0, max: 360, noNaN: true, maxExcluded: true }).map(snap),
);
const rect = fc.record({ x: coord, y: coord, a: angle, L: size, W: size });

describe('overlap verdict vs polygon-clipping (independent oracle)', () => {
  test('bodies: verify reports body-overlap exactly when the oracle area exceeds 1e-6', () => {
    let overlaps = 0;
    let clear = 0;
    fc.assert(
      fc.property(rect, rect, (a, b) => {
        const input = makeVerifyInput([
          { ref: 'A1', x: a.x, y: a.y, angle: a.a, length: a.L, width: a.W, courtyard: 0 },
          { ref: 'B1', x: b.x, y: b.y, angle: b.a, length: b.L, width: b.W, courtyard: 0 },
        ]);
        const engine = verify(input).findings.some((f) => f.kind === 'body-overlap');
        const area = oracleArea(a, b);
        fc.pre(area !== null);
        const oracle = area! > TOUCH_EPS_AREA;
        if (oracle) overlaps++;
        else clear++;
        expect(engine).toBe(oracle);
      }),
      { numRuns: 3000 },
    );
    // both verdicts were exercised
    expect(overlaps).toBeGreaterThan(300);
    expect(clear).toBeGreaterThan(300);
  });

  test('courtyards: any finding exactly when the grown rectangles overlap by the oracle; body-overlap only when the bodies do', () => {
    fc.assert(
      fc.property(rect, rect, fc.integer({ min: 0, max: 50 }).map((v) => v / 100), (a, b, c) => {
        const input = makeVerifyInput([
          { ref: 'A1', x: a.x, y: a.y, angle: a.a, length: a.L, width: a.W, courtyard: c },
          { ref: 'B1', x: b.x, y: b.y, angle: b.a, length: b.L, width: b.W, courtyard: c },
        ]);
        const kinds = verify(input).findings.map((f) => f.kind);
        expect(kinds.length).toBeLessThanOrEqual(1);
        const grownArea = oracleArea(a, b, c);
        const bodyArea = oracleArea(a, b);
        fc.pre(grownArea !== null && bodyArea !== null);
        const grownOverlap = grownArea! > TOUCH_EPS_AREA;
        const bodyOverlap = bodyArea! > TOUCH_EPS_AREA;
        const expected = bodyOverlap ? ['body-overlap'] : grownOverlap ? ['courtyard-overlap'] : [];
        expect(kinds).toEqual(expected);
      }),
      { numRuns: 2000 },
    );
  });

  test('geometry helpers: separating-axis depth > 1e-6 and clipped area > 1e-6 agree with the oracle; the areas match', () => {
    fc.assert(
      fc.property(rect, rect, (a, b) => {
        const ta = (a.a * Math.PI) / 180;
        const tb = (b.a * Math.PI) / 180;
        const args = [
          a.x, a.y, Math.cos(ta), Math.sin(ta), a.L / 2, a.W / 2,
          b.x, b.y, Math.cos(tb), Math.sin(tb), b.L / 2, b.W / 2,
        ] as const;
        const depth = rectSatDepth(...args);
        const area = rectIntersectionArea(...args);
        const oracle = oracleArea(a, b);
        fc.pre(oracle !== null);
        expect(area).toBeCloseTo(oracle!, 6);
        expect(depth > TOUCH_EPS && area > TOUCH_EPS_AREA).toBe(oracle! > TOUCH_EPS_AREA);
      }),
      { numRuns: 3000 },
    );
  });

  test('the oracle gave up on almost no input', () => {
    // polygon-clipping throws on a few near-degenerate inputs; they must stay rare
    expect(oracleFailures).toBeLessThan(30);
  });
});
