// Hand-worked cases of the findings engine, each with its arithmetic beside it (shared/README.md
// "Findings" and shared/verify/README.md: touching is not overlapping below 1e-6 mm; boundaries
// are inside).
import { describe, expect, test } from 'vitest';
import { verify } from '../../../shared/verify';
import { makeVerifyInput, rectQuad, type PartSpec, type LayoutSpec } from '../../../shared/verify/build';
import type { QuadCorners } from '../../../shared/verify';

const SQRT2 = Math.SQRT2;

function run(parts: PartSpec[], layout: LayoutSpec = {}) {
  return verify(makeVerifyInput(parts, layout));
}
const kindsOf = (parts: PartSpec[], layout: LayoutSpec = {}) => run(parts, layout).findings.map((f) => f.kind);

describe('body and courtyard overlap', () => {
  // Two 2 × 1 bodies, courtyard 0.25 (the default).
  test.each([
    // A spans x −1…1; B at x = 2 spans 1…3: the edges meet at x = 1 → touching: no overlap, but
    // the courtyards (grown by 0.25 each) share 0.5 mm → courtyard warning with the bodies' gap 0
    { name: 'touching edges at 0°', b: { x: 2, y: 0, angle: 0 }, kinds: ['courtyard-overlap'], depth: 0.5, distance: 0 },
    // both turned 90°: A spans y −1…1; B at y = 2 spans 1…3 → touching
    { name: 'touching edges at 90°', a: 90, b: { x: 0, y: 2, angle: 90 }, kinds: ['courtyard-overlap'], depth: 0.5, distance: 0 },
    // B at x = 1.99 spans 0.99…2.99: 1 − 0.99 = 0.01 mm of overlap → error only (no courtyard warning)
    { name: 'overlap by 0.01 mm', b: { x: 1.99, y: 0, angle: 0 }, kinds: ['body-overlap'], depth: 0.01, distance: null },
    // B at x = 2.49 spans 1.49…3.49: gap 0.49 < 0.25 + 0.25 → courtyards overlap by 0.01
    { name: 'gap 0.49 mm: courtyards overlap by 0.01', b: { x: 2.49, y: 0, angle: 0 }, kinds: ['courtyard-overlap'], depth: 0.01, distance: 0.49 },
    // B at x = 2.5 spans 1.5…3.5: gap 0.5 = 0.25 + 0.25 → the courtyards only touch: nothing
    { name: 'gap 0.5 mm: courtyards touch', b: { x: 2.5, y: 0, angle: 0 }, kinds: [], depth: null, distance: null },
    // B 1e-7 mm into A: below the 1e-6 threshold → still touching
    { name: 'overlap of 1e-7 mm counts as touching', b: { x: 2 - 1e-7, y: 0, angle: 0 }, kinds: ['courtyard-overlap'], depth: 0.5 + 1e-7, distance: 0 },
  ])('$name', ({ a, b, kinds, depth, distance }) => {
    const res = run([
      { ref: 'R1', x: 0, y: 0, angle: a ?? 0, length: 2, width: 1 },
      { ref: 'R2', x: b.x, y: b.y, angle: b.angle, length: 2, width: 1 },
    ]);
    expect(res.findings.map((f) => f.kind)).toEqual(kinds);
    if (kinds.length) {
      const f = res.findings[0];
      expect(f.refs).toEqual(['1:R1', '1:R2']);
      expect(f.depth!).toBeCloseTo(depth!, 9);
      if (distance === null) expect(f.distance).toBeNull();
      else expect(f.distance!).toBeCloseTo(distance, 9);
    }
  });

  // Corner to edge at 45°: A is a 2 × 2 square at the origin (right edge x = 1); B is a 2 × 2
  // square turned 45°, so its corner is √2 from its centre. With B's centre at x = 1 + √2 the
  // corner sits exactly on A's edge at (1, 0): touching. Moving B 0.01 mm closer pushes the corner
  // 0.01 mm in; the shared triangle has height 0.01 and base 0.02 → area 1e-4 > 1e-6, depth 0.01
  // (along A's x axis; along B's axes the overlap is √2 + 1 − (1 + √2 − 0.01)/√2 ≈ 0.714).
  test.each([
    { name: 'corner on the edge', x: 1 + SQRT2, kinds: ['courtyard-overlap'] },
    { name: 'corner 0.01 mm in', x: 1 + SQRT2 - 0.01, kinds: ['body-overlap'] },
    // 0.01 mm short of the edge: courtyard of A reaches x = 1.25, B's grown corner reaches
    // 1 + √2 + 0.01 − 1.25·√2 ≈ 0.6564 → still a courtyard overlap
    { name: 'corner 0.01 mm short', x: 1 + SQRT2 + 0.01, kinds: ['courtyard-overlap'] },
  ])('corner-to-edge contact at 45°: $name', ({ x, kinds }) => {
    const res = run([
      { ref: 'U1', x: 0, y: 0, length: 2, width: 2 },
      { ref: 'U2', x, y: 0, angle: 45, length: 2, width: 2 },
    ]);
    expect(res.findings.map((f) => f.kind)).toEqual(kinds);
    if (kinds[0] === 'body-overlap') {
      const f = res.findings[0];
      expect(f.depth!).toBeCloseTo(0.01, 9);
      // the drawn polygon is the shared triangle: area = 0.01 · 0.02 / 2 = 1e-4
      expect(f.geometry.type).toBe('polygon');
      if (f.geometry.type === 'polygon') {
        const p = f.geometry.points;
        let area = 0;
        for (let i = 0; i < p.length; i++) {
          const q = p[(i + 1) % p.length];
          area += p[i][0] * q[1] - q[0] * p[i][1];
        }
        expect(Math.abs(area) / 2).toBeCloseTo(1e-4, 9);
      }
    }
  });

  test('parts on different sides never meet; a point body (no package) never overlaps', () => {
    expect(
      kindsOf([
        { ref: 'R1', x: 0, y: 0, length: 2, width: 1 },
        { ref: 'R2', x: 0, y: 0, length: 2, width: 1, side: 'bottom' },
      ]),
    ).toEqual([]);
    expect(
      kindsOf([
        { ref: 'R1', x: 0, y: 0, length: 2, width: 1 },
        { ref: 'X1', x: 0, y: 0, length: 0, width: 0, courtyard: 0, hasPackage: false },
      ]),
    ).toEqual(['no-package']);
  });

  test('one finding per pair, refs sorted by board then natural reference, message names both', () => {
    const res = run([
      { ref: 'R10', x: 0, y: 0, length: 2, width: 1 },
      { ref: 'R2', x: 1.5, y: 0, length: 2, width: 1 },
      { ref: 'C1', board: 10, x: 50, y: 0, length: 2, width: 1 },
      { ref: 'C1', board: 2, x: 51.5, y: 0, length: 2, width: 1 },
    ]);
    expect(res.findings.map((f) => f.refs)).toEqual([
      ['1:R2', '1:R10'],
      ['2:C1', '10:C1'],
    ]);
    // bodies 2 long, centres 1.5 apart → overlap 2 − 1.5 = 0.5
    expect(res.findings[0].message).toBe('R2 on board 1 overlaps R10 on board 1 by 0.500 mm');
    expect(res.findings[1].boards).toEqual([2, 10]);
    expect(res.findings[0].key).toBe('body-overlap|1:R2|1:R10');
  });
});

describe('off-board', () => {
  const board = { board: 1, side: 'top' as const, corners: rectQuad(0, 0, 40, 30) };
  // R0603 body 1.6 × 0.8: half length 0.8
  test.each([
    // centre x = 0.8 → left end at 0.8 − 0.8 = 0: on the board edge from inside → on the board
    { name: 'left end exactly on the edge', x: 0.8, y: 10, angle: 0, depth: null },
    // x = 0.79 → left end at −0.01: 0.01 mm outside
    { name: 'left end 0.01 mm outside', x: 0.79, y: 10, angle: 0, depth: 0.01 },
    // turned 90°: the length runs along y; y = 0.8 → lower end at 0 → on the board
    { name: 'turned 90°, end on the bottom edge', x: 10, y: 0.8, angle: 90, depth: null },
    // upper-right corner: x = 40 − 0.8, y = 30 − 0.4 → corner exactly at (40, 30)
    { name: 'corner exactly in the board corner', x: 39.2, y: 29.6, angle: 0, depth: null },
    // turned 45°: half extent along x = (0.8 + 0.4)/√2 ≈ 0.8485; x = 0.8 → 0.0485 outside
    { name: 'turned 45° near the left edge', x: 0.8, y: 10, angle: 45, depth: (0.8 + 0.4) / SQRT2 - 0.8 },
  ])('$name', ({ x, y, angle, depth }) => {
    const res = run([{ ref: 'R1', x, y, angle, length: 1.6, width: 0.8 }], { boards: [board] });
    if (depth === null) expect(res.findings).toEqual([]);
    else {
      expect(res.findings.map((f) => [f.kind, f.severity])).toEqual([['off-board', 'error']]);
      expect(res.findings[0].depth!).toBeCloseTo(depth, 9);
    }
  });

  // A board turned 30° about its lower-left corner (0, 0): its left edge runs along (−sin30, cos30).
  // A body turned with it, at board-frame (u, v) = (0.8, 10), has its left end on that edge; at
  // u = 0.7 it sticks out by 0.1 mm.
  const turned = (u: number, v: number): [number, number] => {
    const c = Math.cos(Math.PI / 6);
    const s = Math.sin(Math.PI / 6);
    return [u * c - v * s, u * s + v * c];
  };
  const quad = [...turned(0, 0), ...turned(40, 0), ...turned(40, 30), ...turned(0, 30)] as QuadCorners;
  test.each([
    { u: 0.8, depth: null },
    { u: 0.7, depth: 0.1 },
  ])('board turned 30°, body at u = $u', ({ u, depth }) => {
    const [x, y] = turned(u, 10);
    const res = run([{ ref: 'R1', x, y, angle: 30, length: 1.6, width: 0.8 }], {
      boards: [{ board: 1, side: 'top', corners: quad }],
    });
    if (depth === null) expect(res.findings).toEqual([]);
    else expect(res.findings[0].depth!).toBeCloseTo(depth, 9);
  });

  test('a package marked overhang gets a warning; a part is tested against its own board and side only', () => {
    const res = run(
      [
        { ref: 'J1', x: 0.79, y: 10, length: 1.6, width: 0.8, overhang: true },
        // board 2 at x 40…80: this part is on board 2 and inside it
        { ref: 'R1', board: 2, x: 41, y: 10, length: 1.6, width: 0.8 },
        // bottom part: no bottom outline given → not tested
        { ref: 'R2', x: -5, y: 10, length: 1.6, width: 0.8, side: 'bottom' },
      ],
      { boards: [board, { board: 2, side: 'top', corners: rectQuad(40, 0, 80, 30) }] },
    );
    expect(res.findings.map((f) => [f.kind, f.severity, f.refs[0]])).toEqual([['off-board', 'warning', '1:J1']]);
    expect(res.summary).toMatchObject({ errors: 0, warnings: 1 });
  });
});

describe('board layout', () => {
  test.each([
    // boards 0…40 and 40…80 share the edge x = 40 → no overlap
    { name: 'boards sharing an edge', b2: rectQuad(40, 0, 80, 30), kinds: [] },
    // 39…79: 1 mm shared
    { name: 'boards overlapping by 1 mm', b2: rectQuad(39, 0, 79, 30), kinds: ['board-overlap'] },
    // board 2 to 100.5 on a 100 mm panel
    { name: 'board past the panel edge', b2: rectQuad(60.5, 0, 100.5, 30), kinds: ['off-panel'] },
    // board 2 ends exactly on the panel edge: inside
    { name: 'board touching the panel edge from inside', b2: rectQuad(60, 0, 100, 30), kinds: [] },
  ])('$name', ({ b2, kinds }) => {
    const res = run([], {
      boards: [
        { board: 1, side: 'top', corners: rectQuad(0, 0, 40, 30) },
        { board: 2, side: 'top', corners: b2 },
      ],
      panels: [{ side: 'top', corners: rectQuad(0, 0, 100, 30) }],
    });
    expect(res.findings.map((f) => f.kind)).toEqual(kinds);
    for (const f of res.findings) expect(f.refs).toEqual([]);
    if (kinds[0] === 'board-overlap') expect(res.findings[0]).toMatchObject({ boards: [1, 2], depth: 1 });
    if (kinds[0] === 'off-panel') {
      expect(res.findings[0].boards).toEqual([2]);
      expect(res.findings[0].depth!).toBeCloseTo(0.5, 9);
    }
  });

  test('the layout is checked once even when both sides carry it', () => {
    const boards = [
      { board: 1, side: 'top' as const, corners: rectQuad(0, 0, 40, 30) },
      { board: 2, side: 'top' as const, corners: rectQuad(39, 0, 79, 30) },
      // the bottom view of the same panel (flipped about x = 50)
      { board: 1, side: 'bottom' as const, corners: rectQuad(60, 0, 100, 30) },
      { board: 2, side: 'bottom' as const, corners: rectQuad(21, 0, 61, 30) },
    ];
    expect(kindsOf([], { boards })).toEqual(['board-overlap']);
    expect(verify(makeVerifyInput([], { boards }), { sides: 'bottom' }).findings.map((f) => f.side)).toEqual(['bottom']);
  });
});

describe('fiducial clear circle', () => {
  // fiducial at the origin, clear radius 1.0; an R0402 body 1.0 × 0.5 (half 0.5 × 0.25)
  test.each([
    // centre x = 1.5 → near end at 1.5 − 0.5 = 1.0 = the radius → touching the circle: clear
    { name: 'end exactly on the circle', x: 1.5, y: 0, depth: null },
    // x = 1.49 → near end at 0.99 → 0.01 inside
    { name: 'end 0.01 mm inside', x: 1.49, y: 0, depth: 0.01 },
    // corner case: centre (1.2, 0.9) → nearest corner (0.7, 0.65) → √(0.49 + 0.4225) = √0.9125
    // ≈ 0.95525 → 0.04475 inside
    { name: 'corner just inside', x: 1.2, y: 0.9, depth: 1 - Math.sqrt(0.9125) },
    // centre (1.3, 0.95) → corner (0.8, 0.7) → √(0.64 + 0.49) = √1.13 ≈ 1.063 → outside
    { name: 'corner just outside', x: 1.3, y: 0.95, depth: null },
  ])('$name', ({ x, y, depth }) => {
    const res = run([{ ref: 'R7', x, y, length: 1.0, width: 0.5 }], {
      fiducials: [{ name: 'F1', side: 'top', x: 0, y: 0, clearRadius: 1.0 }],
    });
    if (depth === null) expect(res.findings).toEqual([]);
    else {
      expect(res.findings).toHaveLength(1);
      const f = res.findings[0];
      expect(f).toMatchObject({ kind: 'fiducial-clearance', severity: 'error', fiducial: 'F1', refs: ['1:R7'] });
      expect(f.depth!).toBeCloseTo(depth, 9);
      expect(f.distance!).toBeCloseTo(1 - depth, 9);
    }
  });

  test('only fiducials of the part’s side count; two circles give one finding naming the deeper', () => {
    const part: PartSpec = { ref: 'R7', x: 1.49, y: 0, length: 1.0, width: 0.5 };
    expect(kindsOf([part], { fiducials: [{ name: 'FB', side: 'bottom', x: 0, y: 0, clearRadius: 1 }] })).toEqual([]);
    // F1 at the origin: near end 0.99 away → 0.01 inside; F2 at (3, 0): far end at 1.99, 1.01 away
    // from F2 → with clear radius 1.5 it is 0.49 inside: F2 is the deeper
    const res = run([part], {
      fiducials: [
        { name: 'F1', side: 'top', x: 0, y: 0, clearRadius: 1 },
        { name: 'F2', side: 'top', x: 3, y: 0, clearRadius: 1.5 },
      ],
    });
    expect(res.findings).toHaveLength(1);
    expect(res.findings[0].fiducial).toBe('F2');
    expect(res.findings[0].depth!).toBeCloseTo(0.49, 9);
  });
});

describe('nozzle shadow', () => {
  // the part: 0.5 mm tall, holder radius 2.0, at the origin; the neighbour: a 6.6 × 6.6 body
  // (half 3.3) 5.8 mm tall at (x, y)
  test.each([
    // x = 5.0 → its near side at 5.0 − 3.3 = 1.7 < 2.0 → shadow, distance 1.7
    { name: 'in range', x: 5.0, y: 0, h: 5.8, distance: 1.7 },
    // x = 5.4 → near side at 2.1 > 2.0 → no shadow
    { name: 'out of range', x: 5.4, y: 0, h: 5.8, distance: null },
    // x = 5.3 → near side exactly at 2.0: the holder circle only touches the body → no shadow
    { name: 'exactly at the holder radius', x: 5.3, y: 0, h: 5.8, distance: null },
    // diagonal: corner at (4.5 − 3.3, 4.5 − 3.3) = (1.2, 1.2) → √2.88 ≈ 1.697 < 2.0
    { name: 'corner within the radius', x: 4.5, y: 4.5, h: 5.8, distance: Math.sqrt(2.88) },
    // taller by exactly 0.5 (1.0 − 0.5) is not "more than 0.5"
    { name: 'taller by exactly 0.5 mm', x: 5.0, y: 0, h: 1.0, distance: null },
    // taller by 0.51 → shadow
    { name: 'taller by 0.51 mm', x: 5.0, y: 0, h: 1.01, distance: 1.7 },
  ])('$name', ({ x, y, h, distance }) => {
    const res = run([
      { ref: 'C3', x: 0, y: 0, length: 1.0, width: 0.5, height: 0.5, holderRadius: 2.0, courtyard: 0 },
      { ref: 'C4', x, y, length: 6.6, width: 6.6, height: h, holderRadius: 6.0, courtyard: 0 },
    ]);
    if (distance === null) expect(res.findings).toEqual([]);
    else {
      expect(res.findings).toHaveLength(1);
      const f = res.findings[0];
      expect(f).toMatchObject({ kind: 'nozzle-shadow', severity: 'warning', refs: ['1:C3', '1:C4'] });
      expect(f.distance!).toBeCloseTo(distance, 9);
      expect(f.depth!).toBeCloseTo(2.0 - distance, 9);
      expect(f.message).toContain('place C3 first');
    }
  });

  test('1.1 mm next to 0.6 mm is not taller by more than 0.5 (in binary 1.1 − 0.6 = 0.5000000000000001)', () => {
    // U1's near side at 2.5 − 1 = 1.5 < 2.0: in range, so only the height rule decides
    const parts = (h: number): PartSpec[] => [
      { ref: 'C1', x: 0, y: 0, length: 1, width: 0.5, height: 0.6, holderRadius: 2, courtyard: 0 },
      { ref: 'U1', x: 2.5, y: 0, length: 2, width: 2, height: h, holderRadius: 3, courtyard: 0 },
    ];
    expect(1.1 - 0.6 > 0.5).toBe(true);
    expect(kindsOf(parts(1.1))).toEqual([]);
    expect(kindsOf(parts(1.11))).toEqual(['nozzle-shadow']);
  });

  test('a part without a nozzle (holder 0) is not tested for shadow', () => {
    expect(
      kindsOf([
        { ref: 'C3', x: 0, y: 0, length: 1, width: 0.5, height: 0.5, holderRadius: 0, courtyard: 0, hasNozzle: false },
        { ref: 'C4', x: 5, y: 0, length: 6.6, width: 6.6, height: 5.8, holderRadius: 6, courtyard: 0 },
      ]),
    ).toEqual(['no-nozzle']);
  });
});

describe('machine reach', () => {
  const reach = { x: 400, y: 400 };
  test.each([
    // [0, 400] × [0, 400], boundary inside
    { name: 'on the far corner (400, 400)', x: 400, y: 400, depth: null },
    { name: 'on the origin', x: 0, y: 0, depth: null },
    { name: '0.001 mm beyond x = 400', x: 400.001, y: 10, depth: 0.001 },
    { name: '0.01 mm below y = 0', x: 10, y: -0.01, depth: 0.01 },
  ])('$name', ({ x, y, depth }) => {
    // the reach is tested on the body centre: a large body hanging past it does not matter
    const res = run([{ ref: 'U1', x, y, length: 10, width: 10 }], { reach });
    if (depth === null) expect(res.findings).toEqual([]);
    else {
      expect(res.findings.map((f) => f.kind)).toEqual(['out-of-reach']);
      expect(res.findings[0].depth!).toBeCloseTo(depth, 9);
    }
  });

  test.each([
    { name: 'panel exactly the reach', w: 400, kinds: [] },
    { name: 'panel 0.5 mm wider than the reach', w: 400.5, kinds: ['out-of-reach'] },
  ])('$name', ({ w, kinds }) => {
    const res = run([], { reach, panels: [{ side: 'top', corners: rectQuad(0, 0, w, 300) }] });
    expect(res.findings.map((f) => f.kind)).toEqual(kinds);
    if (kinds.length) {
      expect(res.findings[0]).toMatchObject({ refs: [], boards: [], board: null, key: 'out-of-reach|panel' });
      expect(res.findings[0].message).toContain('larger than the machine reach');
    }
  });
});

describe('package and nozzle', () => {
  test('no package: one error (not also no-nozzle); no nozzle: one error', () => {
    const res = run([
      { ref: 'J9', x: 0, y: 0, length: 0, width: 0, courtyard: 0, hasPackage: false, hasNozzle: false, footprint: 'TB-5MM' },
      { ref: 'R9', x: 10, y: 0, length: 6.3, width: 3.2, hasNozzle: false, packageName: 'R2512' },
    ]);
    expect(res.findings.map((f) => [f.kind, f.refs])).toEqual([
      ['no-package', ['1:J9']],
      ['no-nozzle', ['1:R9']],
    ]);
    expect(res.findings[0].message).toContain('"TB-5MM"');
    expect(res.findings[1].message).toContain('R2512');
  });
});
