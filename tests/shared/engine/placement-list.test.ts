import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import {
  CSV_HEADER,
  fmt3,
  readPlacementList,
  sha256Hex,
  writePlacementListCsv,
  writePlacementListJson,
} from '../../../shared/placement-list';
import { allocatePlacementColumns } from '../../../shared/core';
import { EngineInputError } from '../../../shared/core';
import type { RunResult } from '../../../shared/core';
import { runSample } from './helpers';

const GEN = '2026-03-11T09:00:00Z';

describe('fmt3', () => {
  test.each([
    [0, '0.000'], [-0.0001, '0.000'], [1.5, '1.500'], [-2.25, '-2.250'], [123.4567, '123.457'], [0.0005, '0.001'], [99.9999, '100.000'],
  ])('%s → %s', (v, s) => expect(fmt3(v)).toBe(s));
  test('agrees with toFixed(3) away from ties', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (v) => {
        const q = Math.abs(v * 1000 - Math.trunc(v * 1000));
        fc.pre(Math.abs(q - 0.5) > 1e-6);
        const want = v.toFixed(3) === '-0.000' ? '0.000' : v.toFixed(3);
        expect(fmt3(v)).toBe(want);
      }),
      { numRuns: 500 },
    );
  });
});

describe('SHA-256 (Web Crypto)', () => {
  test('FIPS 180-2 test vector "abc"', async () => {
    expect(await sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});

describe('CSV writer: exactly shared/placement-list/README.md', () => {
  test('weather-station top: metadata order, header, rows, checksum', async () => {
    const r = runSample('weather-station', 'top');
    const { text, sha256 } = await writePlacementListCsv(r, { generated: GEN });
    const lines = text.split('\n');
    const keys = lines.filter((l) => l.startsWith('#')).map((l) => /^# ([a-z0-9-]+):/.exec(l)![1]);
    const known = keys.filter((k) => k !== 'board-transform');
    expect([...new Set(known)]).toEqual(['format', 'program', 'revision', 'side', 'units', 'frame', 'transform', 'fiducial', 'boards', 'placements', 'generated', 'sha256']);
    expect(lines[0]).toBe('# format: placewright-placement-list/1');
    expect(text).toContain('# generated: 2026-03-11T09:00:00.000Z\n');
    expect(text).toMatch(/# transform: model=affine rotationDeg=[\d.]+ scale=[\d.]+ tx=[\d.-]+ ty=[\d.-]+ rms=[\d.]+/);
    const headerIdx = lines.indexOf(CSV_HEADER);
    expect(headerIdx).toBe(keys.length);
    const body = lines.slice(headerIdx).join('\n');
    expect(await sha256Hex(body)).toBe(sha256);
    expect(text).toContain(`# sha256: ${sha256}\n`);
    const rows = lines.slice(headerIdx + 1).filter((l) => l !== '');
    expect(rows).toHaveLength(r.placements.count);
    expect(rows[0].split(',')[0]).toBe('1');
    for (const row of rows.slice(0, 50)) expect(row).toMatch(/^\d+,\d+,[^,]+,-?\d+\.\d{3},-?\d+\.\d{3},\d+\.\d{3},/);
    expect(text.includes('\r')).toBe(false);
  });
  test('no transform: model=none, frame panel; fiducials at their panel positions', async () => {
    const r = runSample('led-strip', 'top');
    const { text } = await writePlacementListCsv(r, { generated: GEN });
    expect(text).toContain('# frame: panel\n# transform: model=none\n# fiducial: PT1 4.000 4.000\n');
    expect(text).toContain('# boards: 20\n');
  });
  test('RFC 4180 quoting of text fields', async () => {
    const r = fakeResult(1);
    r.placements.value[0] = 'he said "10k, 1%"';
    const { text } = await writePlacementListCsv(r, { generated: GEN });
    expect(text).toContain(',"he said ""10k, 1%"""\n');
    const back = await readPlacementList(text);
    expect(back.placements[0].value).toBe('he said "10k, 1%"');
  });
});

describe('reader', () => {
  test('CSV round trip gives the same placements (to 3 decimals)', async () => {
    const r = runSample('weather-station', 'bottom');
    const { text } = await writePlacementListCsv(r, { generated: GEN });
    const back = await readPlacementList(text, { file: 'w.csv' });
    expect(back.meta).toMatchObject({ side: 'bottom', frame: 'machine', boards: 2, placements: r.placements.count, program: 'weather-ctl', revision: 'B' });
    expect(back.meta.transform?.model).toBe(r.transform?.model);
    expect(back.fiducials.map((f) => f.name)).toEqual(r.fiducials.map((f) => f.name));
    for (let i = 0; i < r.placements.count; i++) {
      const p = back.placements[i];
      expect(p.ref).toBe(r.placements.ref[i]);
      expect(p.x).toBeCloseTo(r.placements.x[i], 3);
      expect(p.y).toBeCloseTo(r.placements.y[i], 3);
      expect(p.package).toBe(r.placements.packageName[i]);
      expect(p.nozzle).toBe(r.placements.nozzle[i]);
    }
  });
  test('JSON round trip is exact', async () => {
    const r = runSample('led-strip', 'bottom');
    const { text } = await writePlacementListJson(r, { generated: GEN });
    const back = await readPlacementList(text);
    expect(back.encoding).toBe('json');
    expect(back.placements.map((p) => [p.seq, p.board, p.ref, p.x, p.y, p.rotation])).toEqual(
      Array.from({ length: r.placements.count }, (_, i) => [i + 1, r.placements.board[i], r.placements.ref[i], r.placements.x[i], r.placements.y[i], r.placements.rotation[i]]),
    );
    expect(JSON.parse(text).meta.transform).toBeNull();
  });
  test('a changed row breaks the checksum: a clear error', async () => {
    const { text } = await writePlacementListCsv(runSample('led-strip', 'top'), { generated: GEN });
    const tampered = text.replace(/\n1,1,D1,([\d.]+),/, '\n1,1,D1,99.999,');
    expect(tampered).not.toBe(text);
    await expect(readPlacementList(tampered)).rejects.toThrow(/checksum mismatch/);
    await expect(readPlacementList(tampered)).rejects.toBeInstanceOf(EngineInputError);
  });
  test('a wrong header row is named', async () => {
    const { text } = await writePlacementListCsv(fakeResult(1), { generated: GEN });
    const body = 'seq,board,ref\n';
    const bad = text.replace(/# sha256: [0-9a-f]+\n[\s\S]*$/, `# sha256: ${await sha256Hex(body)}\n${body}`);
    await expect(readPlacementList(bad)).rejects.toThrow(/expected the header row/);
  });
  test('CSV write → read round-trips arbitrary placements (property)', async () => {
    const text = fc.string({ maxLength: 12 }).filter((s) => !s.includes('\r'));
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.record({ x: fc.double({ min: -1000, max: 1000, noNaN: true }), y: fc.double({ min: -1000, max: 1000, noNaN: true }), rot: fc.double({ min: 0, max: 359.999, noNaN: true }), ref: text.filter((s) => s.length > 0), value: text, pn: text }), { minLength: 1, maxLength: 30 }),
        async (rows) => {
          const r = fakeResult(rows.length);
          rows.forEach((row, i) => {
            r.placements.x[i] = row.x;
            r.placements.y[i] = row.y;
            r.placements.rotation[i] = row.rot;
            r.placements.ref[i] = row.ref;
            r.placements.value[i] = row.value;
            r.placements.partNumber[i] = row.pn;
          });
          const back = await readPlacementList((await writePlacementListCsv(r, { generated: GEN })).text);
          rows.forEach((row, i) => {
            const p = back.placements[i];
            expect(p.ref).toBe(row.ref);
            expect(p.value).toBe(row.value);
            expect(p.partNumber).toBe(row.pn);
            expect(Math.abs(p.x - row.x)).toBeLessThanOrEqual(0.0005 + 1e-9);
            expect(Math.abs(p.y - row.y)).toBeLessThanOrEqual(0.0005 + 1e-9);
            expect(p.rotation).toBeGreaterThanOrEqual(0);
            expect(p.rotation).toBeLessThan(360);
          });
        },
      ),
      { numRuns: 60 },
    );
  });
});

function fakeResult(n: number): RunResult {
  const p = allocatePlacementColumns(n);
  for (let i = 0; i < n; i++) {
    p.seq[i] = i + 1; p.board[i] = 1; p.ref[i] = `R${i + 1}`; p.side[i] = 'top';
    p.packageName[i] = null; p.nozzle[i] = null; p.vision[i] = null; p.partNumber[i] = ''; p.value[i] = ''; p.footprint[i] = '';
  }
  const q = { x: 0, y: 0 };
  return {
    side: 'top', frame: 'panel', program: 'p', revision: 'r', placements: p, boards: [], boardsPlaced: 1,
    board: { width: 10, height: 10, originX: 0, originY: 0 },
    panel: { width: 10, height: 10, outline: [q, q, q, q], flipAxis: 'vertical' },
    fiducials: [], transform: null, boardTransforms: [], unmatched: [], machine: null,
    import: { placements: [], columns: {}, units: 'mm', dialect: { delimiter: ',', decimalComma: false, headerLine: 1, bom: false, lineEnding: '\n', unitsSource: 'option', dnpSense: null }, headers: [], warnings: [] },
    warnings: [],
  };
}
