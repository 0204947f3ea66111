import { describe, expect, test } from 'vitest';
import { runJob } from '../../../shared/pipeline';
import { placementRecord, placementRecords } from '../../../shared/core';
import { EngineInputError } from '../../../shared/core';
import { libraryFileSchema } from '../../../shared/schemas/library-file.schema';
import { bodyCorners, job, pointInConvex, polygonsOverlap, runSample } from './helpers';

const csv = [
  'Ref,X,Y,Rot,Side,Package,DNP',
  'R1,20,23,30,top,R0603,', // board frame (10, 3)
  'J1,40,40,90,top,HDR,', // board frame (30, 20), body offset (1, 0)
  'U1,30,30,0,top,MYSTERY,',
  'R9,25,25,0,top,R0603,x', // DNP
  'C1,20,23,10,bottom,R0603,',
].join('\n');

const library = libraryFileSchema.parse({
  format: 'placewright-library/1',
  packages: [
    { name: 'R0603', body: { length: 1.6, width: 0.8, height: 0.45 }, nozzles: ['N07'], vision: 'chip-small' },
    { name: 'HDR', body: { length: 4, width: 2, height: 6, offsetX: 1, offsetY: 0 }, rotationOffset: 90, courtyard: 0.5, overhang: true },
  ],
  nozzles: [{ name: 'N07', tipOuter: 0.7, holderRadius: 2.5 }, { name: 'N14', tipOuter: 1.4, holderRadius: 3.5 }],
});

// board 60 × 40 at design origin (10, 20); panel 140 × 100; grid 2 × 2, pitch 65 × 45, offset 5;
// cell (0, 1) turned 180°, cell (1, 1) skipped
const baseJob = job({
  board: { originX: 10, originY: 20, width: 60, height: 40 },
  panel: {
    width: 140, height: 100,
    grid: { rows: 2, cols: 2, pitchX: 65, pitchY: 45, offsetX: 5, offsetY: 5, cellRotations: [{ row: 0, col: 1, rotation: 180 }], skip: [{ row: 1, col: 1 }] },
  },
  machine: { reachX: 400, reachY: 400, nozzles: ['N07', 'N14'] },
  program: 'demo', revision: 'A',
});

describe('runJob: panel frame', () => {
  const r = runJob({ job: baseJob, centroidText: csv, library, side: 'top' });
  const rec = placementRecords(r.placements);
  test('boards by number, parts in file order, DNP and skipped boards left out', () => {
    expect(r.frame).toBe('panel');
    expect(rec.map((p) => `${p.board}:${p.ref}`)).toEqual(['1:R1', '1:J1', '1:U1', '2:R1', '2:J1', '2:U1', '3:R1', '3:J1', '3:U1']);
    expect(rec.map((p) => p.seq)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(r.boardsPlaced).toBe(3);
    expect(r.boards.map((b) => [b.number, b.skipped])).toEqual([[1, false], [2, false], [3, false], [4, true]]);
  });
  test('hand-worked positions (shared/README.md, "Step-and-repeat")', () => {
    // R1 board 1 (φ 0, A = (5, 5)): (5 + 10, 5 + 3) = (15, 8), rotation 30
    expect([rec[0].x, rec[0].y, rec[0].rotation]).toEqual([15, 8, 30]);
    // R1 board 2 (φ 180, A = (70, 5)): A + (W − u, H − v) = (70 + 60 − 10, 5 + 40 − 3) = (120, 42), rotation 30 + 180 = 210
    expect(rec[3].x).toBeCloseTo(120, 12);
    expect(rec[3].y).toBeCloseTo(42, 12);
    expect(rec[3].rotation).toBeCloseTo(210, 12);
    // R1 board 3 (φ 0, A = (5, 50)): (15, 53)
    expect([rec[6].x, rec[6].y]).toEqual([15, 53]);
  });
  test('rotation offset and body offset turned by the output rotation', () => {
    // J1 board 1: placement (5 + 30, 5 + 20) = (35, 25); rotation 90 + offset 90 = 180;
    // body offset (1, 0) turned by 180° = (−1, 0) → body centre (34, 25)
    const j = rec[1];
    expect([j.originX, j.originY]).toEqual([35, 25]);
    expect(j.rotation).toBe(180);
    expect(j.x).toBeCloseTo(34, 12);
    expect(j.y).toBeCloseTo(25, 12);
    // J1 board 2: rotation 90 + 180 + 90 = 360 → 0; offset (1, 0) unturned
    expect(rec[4].rotation).toBe(0);
    expect(rec[4].x - rec[4].originX).toBeCloseTo(1, 12);
  });
  test('package, nozzle, vision, body and courtyard per placement', () => {
    expect(rec[0]).toMatchObject({ packageName: 'R0603', nozzle: 'N07', vision: 'chip-small', bodyLength: 1.6, bodyWidth: 0.8, bodyHeight: 0.45, courtyard: 0.25, holderRadius: 2.5, overhang: false });
    // HDR has no nozzle list: largest tip of the machine's with tipOuter ≤ min(4, 2) → N14
    expect(rec[1]).toMatchObject({ packageName: 'HDR', nozzle: 'N14', holderRadius: 3.5, courtyard: 0.5, overhang: true, vision: null });
    expect(rec[2]).toMatchObject({ packageName: null, nozzle: null, vision: null, bodyLength: null, bodyHeight: null, holderRadius: null, footprint: 'MYSTERY' });
  });
  test('unmatched footprints are reported with counts, not dropped', () => {
    expect(r.unmatched).toEqual([{ footprint: 'MYSTERY', count: 1, placements: 3, refs: ['U1'] }]);
  });
  test('outlines: board 2 turned 180° still covers its anchor box', () => {
    const b2 = r.boards[1].outline;
    const xs = b2.map((p) => p.x), ys = b2.map((p) => p.y);
    expect(Math.min(...xs)).toBeCloseTo(70, 12);
    expect(Math.max(...xs)).toBeCloseTo(130, 12);
    expect(Math.min(...ys)).toBeCloseTo(5, 12);
    expect(Math.max(...ys)).toBeCloseTo(45, 12);
    expect(r.panel.outline).toEqual([{ x: 0, y: 0 }, { x: 140, y: 0 }, { x: 140, y: 100 }, { x: 0, y: 100 }]);
  });
  test('record view rejects a bad index', () => {
    expect(() => placementRecord(r.placements, 9)).toThrow(/out of range: 9 placements/);
  });
});

describe('runJob: bottom side', () => {
  test('vertical flip: (PW − P.x, P.y), rotation θb − φ', () => {
    const r = runJob({ job: baseJob, centroidText: csv, library, side: 'bottom' });
    const rec = placementRecords(r.placements);
    expect(rec.map((p) => `${p.board}:${p.ref}`)).toEqual(['1:C1', '2:C1', '3:C1']);
    // board 1: P = (15, 8) → (140 − 15, 8) = (125, 8); rotation 10 − 0 = 10
    expect([rec[0].x, rec[0].y, rec[0].rotation]).toEqual([125, 8, 10]);
    // board 2: P = (120, 42) → (20, 42); rotation 10 − 180 = −170 → 190
    expect(rec[1].x).toBeCloseTo(20, 12);
    expect(rec[1].rotation).toBeCloseTo(190, 12);
  });
  test('horizontal flip: (P.x, PH − P.y), rotation θb − φ + 180', () => {
    const j = job({ ...baseJob, panel: { ...baseJob.panel, flipAxis: 'horizontal' } });
    const rec = placementRecords(runJob({ job: j, centroidText: csv, library, side: 'bottom' }).placements);
    // board 1: (15, 100 − 8) = (15, 92); rotation 10 − 0 + 180 = 190
    expect([rec[0].x, rec[0].y, rec[0].rotation]).toEqual([15, 92, 190]);
  });
  test('bottom fiducials are flipped like parts', () => {
    const j = job({ ...baseJob, fiducials: [{ name: 'B1', side: 'bottom', frame: 'panel', x: 3, y: 3 }, { name: 'T1', side: 'top', frame: 'panel', x: 3, y: 3 }] });
    const r = runJob({ job: j, centroidText: csv, library, side: 'bottom' });
    expect(r.fiducials).toHaveLength(1);
    expect(r.fiducials[0]).toMatchObject({ name: 'B1', x: 137, y: 3, clearRadius: 1 });
  });
});

describe('runJob: machine frame', () => {
  const fids = [
    { name: 'P1', side: 'top', frame: 'panel', x: 3, y: 3, measured: { x: 103, y: 53 } },
    { name: 'P2', side: 'top', frame: 'panel', x: 137, y: 3, measured: { x: 237, y: 53 } },
    { name: 'P3', side: 'top', frame: 'panel', x: 3, y: 97, measured: { x: 103, y: 147 } },
  ] as const;
  test('a pure translation (100, 50) moves every placement', () => {
    const r = runJob({ job: job({ ...baseJob, fiducials: [...fids] }), centroidText: csv, library, side: 'top' });
    expect(r.frame).toBe('machine');
    expect(r.transform?.model).toBe('affine');
    expect(r.placements.x[0]).toBeCloseTo(115, 9);
    expect(r.placements.y[0]).toBeCloseTo(58, 9);
    expect(r.panel.outline[0].x).toBeCloseTo(100, 9);
  });
  test('transform rotation is added to the part rotation', () => {
    // panel turned by 90° about the origin: (x, y) → (−y, x)
    const turned = fids.map((f) => ({ ...f, measured: { x: -f.y, y: f.x } }));
    const r = runJob({ job: job({ ...baseJob, fiducials: turned, transform: 'similarity' }), centroidText: csv, library, side: 'top' });
    expect(r.transform?.rotationDeg).toBeCloseTo(90, 9);
    expect(r.placements.rotation[0]).toBeCloseTo(120, 9); // 30 + 90
    expect(r.placements.x[0]).toBeCloseTo(-8, 9);
    expect(r.placements.y[0]).toBeCloseTo(15, 9);
  });
  test('a board with two measured local fiducials gets its own transform', () => {
    const local = { name: 'L1', side: 'top' as const, frame: 'board' as const, x: 2, y: 2, measured: { '2': { x: 0, y: 0 } } };
    // board 2 (φ 180, A = (70, 5)): (2, 2) → (70 + 58, 5 + 38) = (128, 43); (58, 38) → (72, 7)
    const j = job({
      ...baseJob,
      fiducials: [
        ...fids,
        { ...local, measured: { '2': { x: 228.5, y: 93 } } },
        { name: 'L2', side: 'top', frame: 'board', x: 58, y: 38, measured: { '2': { x: 172.5, y: 57 } } },
      ],
    });
    const r = runJob({ job: j, centroidText: csv, library, side: 'top' });
    expect(r.boardTransforms.map((b) => b.board)).toEqual([2]);
    expect(r.boards[1].localTransform).toBe(true);
    // board 2 shifted by (100.5, 50) instead of (100, 50): R1 at (120, 42) → (220.5, 92)
    expect(r.placements.x[3]).toBeCloseTo(220.5, 9);
    expect(r.placements.x[0]).toBeCloseTo(115, 9);
    // stepped-out local fiducials are listed for every placed board
    expect(r.fiducials.filter((f) => f.frame === 'board').map((f) => f.name)).toEqual(['L1@1', 'L1@2', 'L1@3', 'L2@1', 'L2@2', 'L2@3']);
  });
  test('measured local fiducial on a board that does not exist', () => {
    const j = job({ ...baseJob, fiducials: [{ name: 'L1', side: 'top', frame: 'board', x: 1, y: 1, measured: { '9': { x: 0, y: 0 } } }] });
    expect(() => runJob({ job: j, centroidText: csv, library, side: 'top' })).toThrow(EngineInputError);
  });
  test('duplicate fiducial names on one side', () => {
    const j = job({ ...baseJob, fiducials: [{ name: 'A', side: 'top', frame: 'panel', x: 1, y: 1 }, { name: 'A', side: 'top', frame: 'panel', x: 2, y: 2 }] });
    expect(() => runJob({ job: j, centroidText: csv, library, side: 'top' })).toThrow(/duplicate fiducial name "A"/);
  });
  test('no library: every part unmatched, a warning', () => {
    const r = runJob({ job: baseJob, centroidText: csv, library: null, side: 'top' });
    expect(r.warnings.some((w) => w.code === 'no-library')).toBe(true);
    expect(r.unmatched.map((u) => u.footprint).sort()).toEqual(['HDR', 'MYSTERY', 'R0603']);
  });
});

describe('samples are clean (no planted faults)', () => {
  for (const name of ['weather-station', 'led-strip'] as const) {
    for (const side of ['top', 'bottom'] as const) {
      test(`${name} ${side}: matched, on board, no overlaps, clear of fiducials, in reach`, () => {
        const r = runSample(name, side);
        const p = r.placements;
        expect(p.count).toBeGreaterThan(0);
        expect(r.unmatched).toEqual([]);
        const bodies: [number, number][][] = [];
        for (let i = 0; i < p.count; i++) {
          expect(p.nozzle[i], `${p.board[i]}:${p.ref[i]} nozzle`).not.toBeNull();
          const c = bodyCorners(p.x[i], p.y[i], p.bodyLength[i], p.bodyWidth[i], p.rotation[i]);
          bodies.push(c);
          const outline = r.boards.find((b) => b.number === p.board[i])!.outline.map((q) => [q.x, q.y] as [number, number]);
          for (const corner of c) expect(pointInConvex(corner, outline), `${p.board[i]}:${p.ref[i]} on board`).toBe(true);
          expect(p.x[i]).toBeGreaterThanOrEqual(0);
          expect(p.x[i]).toBeLessThanOrEqual(r.machine!.reachX);
          expect(p.y[i]).toBeGreaterThanOrEqual(0);
          expect(p.y[i]).toBeLessThanOrEqual(r.machine!.reachY);
          for (const f of r.fiducials) {
            const inside = pointInConvex([f.x, f.y], c) ;
            const dist = Math.min(...c.map((q, k) => segDist(f.x, f.y, q, c[(k + 1) % 4])));
            expect(inside || dist < f.clearRadius, `${p.ref[i]} near fiducial ${f.name}`).toBe(false);
          }
        }
        for (let i = 0; i < p.count; i++) {
          for (let j = i + 1; j < p.count; j++) {
            if (Math.abs(p.x[i] - p.x[j]) > 15 || Math.abs(p.y[i] - p.y[j]) > 15) continue;
            expect(polygonsOverlap(bodies[i], bodies[j]), `${p.board[i]}:${p.ref[i]} / ${p.board[j]}:${p.ref[j]}`).toBe(false);
          }
        }
      });
    }
  }
  test('weather-station: ~180 parts on both sides, 2-up, machine frame', () => {
    const t = runSample('weather-station', 'top'), b = runSample('weather-station', 'bottom');
    expect(t.import.placements.length).toBe(180);
    expect(t.boardsPlaced).toBe(2);
    expect(t.frame).toBe('machine');
    expect(b.frame).toBe('machine');
    expect(t.transform?.warnings).toEqual([]);
    expect(b.transform?.warnings).toEqual([]);
  });
  test('led-strip: 14 parts, 4 × 5 panel with columns 1 and 3 turned', () => {
    const t = runSample('led-strip', 'top');
    expect(t.import.placements.length).toBe(14);
    expect(t.boards).toHaveLength(20);
    expect(t.boards.filter((b) => b.rotation === 180).map((b) => b.col)).toEqual([1, 3, 1, 3, 1, 3, 1, 3]);
    expect(t.import.placements.find((p) => p.ref === 'R5')?.dnp).toBe(true);
  });
});

function segDist(px: number, py: number, a: [number, number], b: [number, number]): number {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const t = Math.max(0, Math.min(1, ((px - a[0]) * dx + (py - a[1]) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(px - (a[0] + t * dx), py - (a[1] + t * dy));
}

describe('test helpers (so the clean-sample check can fail)', () => {
  test('overlap test: overlapping, touching, apart, turned', () => {
    const a = bodyCorners(0, 0, 2, 2, 0);
    expect(polygonsOverlap(a, bodyCorners(1.5, 0, 2, 2, 0))).toBe(true);
    expect(polygonsOverlap(a, bodyCorners(2, 0, 2, 2, 0))).toBe(false); // touching is not overlapping
    expect(polygonsOverlap(a, bodyCorners(2.3, 0, 2, 2, 45))).toBe(true); // the turned corner reaches x = 2.3 − √2
    expect(polygonsOverlap(a, bodyCorners(2.5, 0, 2, 2, 45))).toBe(false);
    expect(pointInConvex([0.5, 0.5], a)).toBe(true);
    expect(pointInConvex([1.5, 0.5], a)).toBe(false);
  });
});

describe('derived columns (built on first read)', () => {
  test('every column has length count and the expected values, also after structured cloning', () => {
    const r = runSample('led-strip', 'top');
    const p = r.placements;
    const keys = ['seq', 'board', 'ref', 'side', 'x', 'y', 'originX', 'originY', 'rotation', 'packageName', 'nozzle', 'vision', 'bodyLength', 'bodyWidth', 'bodyHeight', 'courtyard', 'overhang', 'holderRadius', 'partNumber', 'value', 'footprint', 'sourceIndex'] as const;
    for (const k of keys) expect((p[k] as ArrayLike<unknown>).length, k).toBe(p.count);
    expect(Array.from(p.seq.slice(0, 3))).toEqual([1, 2, 3]);
    // 11 top parts per board (R5 not fitted), boards 1..20 in order
    expect(p.board[10]).toBe(1);
    expect(p.board[11]).toBe(2);
    expect(p.sourceIndex[11]).toBe(p.sourceIndex[0]);
    const clone = structuredClone(p);
    expect(clone.ref).toEqual(p.ref);
    expect(Array.from(clone.board)).toEqual(Array.from(p.board));
  });
  test('a derived column can be replaced by assignment', () => {
    const p = runSample('led-strip', 'top').placements;
    p.value = p.value.map((v) => v.toUpperCase());
    expect(p.value[0]).toBe('GREEN 570NM');
  });
  test('originX/Y take the turned body offset back off', () => {
    const r = runSample('weather-station', 'top');
    const p = r.placements;
    const i = p.ref.indexOf('J1');
    // HDR-1x4-2.0 body offset (3.0, −1.0) turned by the output rotation
    const t = (p.rotation[i] * Math.PI) / 180;
    expect(p.x[i] - p.originX[i]).toBeCloseTo(3 * Math.cos(t) + 1 * Math.sin(t), 9);
    expect(p.y[i] - p.originY[i]).toBeCloseTo(3 * Math.sin(t) - 1 * Math.cos(t), 9);
  });
});

describe('runJob on an import read back from JSON (records, no table)', () => {
  test('gives the same placements as on the fresh import', () => {
    const fresh = runJob({ job: baseJob, centroidText: csv, library, side: 'top' });
    const imported = JSON.parse(JSON.stringify(fresh.import));
    const again = runJob({ job: baseJob, imported, library, side: 'top' });
    expect(placementRecords(again.placements)).toEqual(placementRecords(fresh.placements));
  });
  test('edited records are what the engine uses', () => {
    const imp = runJob({ job: baseJob, centroidText: csv, library, side: 'top' }).import;
    imp.placements[0].x += 1; // R1 moves 1 mm right
    const r = runJob({ job: baseJob, imported: imp, library, side: 'top' });
    expect(r.placements.x[0]).toBe(16);
  });
});
