import { describe, expect, test } from 'vitest';
import { Assigner, PackageMatcher, chooseNozzle } from '../../../shared/library';
import { libraryFileSchema, libraryPackageSchema } from '../../../shared/schemas/library-file.schema';
import { loadSampleLibrary } from './helpers';

const pkg = (name: string, aliases: string[] = [], extra: object = {}) =>
  libraryPackageSchema.parse({ name, aliases, body: { length: 1.6, width: 0.8, height: 0.8 }, ...extra });

describe('footprint matching (shared/library/README.md: name, alias, pattern longest first; case-insensitive)', () => {
  const m = new PackageMatcher([
    pkg('C0603', ['0603', 'C_0603*']),
    pkg('R0603', ['R_0603*', 'R_06*']),
    pkg('ANY', ['*']),
    pkg('0603-SPECIAL'),
  ]);
  test.each([
    ['c0603', 'C0603', 'name'],
    ['0603', 'C0603', 'alias'],
    ['C_0603_1608', 'C0603', 'pattern'],
    ['r_0603_hand', 'R0603', 'pattern'], // R_0603* (7) beats R_06* (5) and * (1)
    ['R_0612', 'R0603', 'pattern'],
    ['whatever', 'ANY', 'pattern'],
    ['0603-special', '0603-SPECIAL', 'name'],
  ])('%s → %s by %s', (fp, name, by) => {
    const r = m.match(fp);
    expect(r.pkg?.name).toBe(name);
    expect(r.by).toBe(by);
  });
  test('a name beats an alias of an earlier package', () => {
    const mm = new PackageMatcher([pkg('A', ['B']), pkg('B')]);
    expect(mm.match('b').pkg?.name).toBe('B');
  });
  test('? matches one character', () => {
    const mm = new PackageMatcher([pkg('SOT', ['SOT-23-?'])]);
    expect(mm.match('SOT-23-5').pkg?.name).toBe('SOT');
    expect(mm.match('SOT-23-10').pkg).toBeNull();
  });
  test('no match, empty footprint', () => {
    const mm = new PackageMatcher([pkg('C0603')]);
    expect(mm.match('C0805').pkg).toBeNull();
    expect(mm.match('').pkg).toBeNull();
  });
  test('regex characters in an alias are literal', () => {
    const mm = new PackageMatcher([pkg('P', ['A.B(1)*'])]);
    expect(mm.match('A.B(1)-x').pkg?.name).toBe('P');
    expect(mm.match('AxB(1)-x').pkg).toBeNull();
  });
});

describe('nozzle choice', () => {
  const lib = libraryFileSchema.parse({
    format: 'placewright-library/1',
    packages: [],
    nozzles: [
      { name: 'N05', tipOuter: 0.5, holderRadius: 2 },
      { name: 'N10', tipOuter: 1.0, holderRadius: 3 },
      { name: 'N25', tipOuter: 2.5, holderRadius: 4.5 },
    ],
  });
  test('first of the package list that the machine has', () => {
    expect(chooseNozzle(pkg('X', [], { nozzles: ['N05', 'N10'] }), lib.nozzles, ['N10', 'N05'])).toBe('N05');
    expect(chooseNozzle(pkg('X', [], { nozzles: ['N05', 'N10'] }), lib.nozzles, ['N10'])).toBe('N10');
    expect(chooseNozzle(pkg('X', [], { nozzles: ['N05'] }), lib.nozzles, ['N25'])).toBeNull();
  });
  test('without a list: the largest tip not larger than the body\'s smaller side', () => {
    const big = libraryPackageSchema.parse({ name: 'B', body: { length: 5, width: 3, height: 2 } });
    expect(chooseNozzle(big, lib.nozzles, null)).toBe('N25'); // 2.5 ≤ 3
    expect(chooseNozzle(big, lib.nozzles, ['N05', 'N10'])).toBe('N10'); // of the machine's
    const tiny = libraryPackageSchema.parse({ name: 'T', body: { length: 0.4, width: 0.2, height: 0.1 } });
    expect(chooseNozzle(tiny, lib.nozzles, null)).toBeNull();
  });
  test('assignment carries the holder radius and vision preset', () => {
    const l = libraryFileSchema.parse({ ...lib, packages: [pkg('C0603', [], { nozzles: ['N10'], vision: 'chip-small' })] });
    const a = new Assigner(l, ['N10']).assign('c0603');
    expect(a).toMatchObject({ nozzle: 'N10', holderRadius: 3, vision: 'chip-small', matchedBy: 'name' });
  });
});

describe('sample library', () => {
  const lib = loadSampleLibrary();
  const body = (n: string) => lib.packages.find((p) => p.name === n)!.body;
  // EIA-198 / IEC 60115-8 size codes, from memory: nominal L × W mm
  test.each([
    ['R0402', 1.0, 0.5], ['C0402', 1.0, 0.5],
    ['R0603', 1.6, 0.8], ['C0603', 1.6, 0.8], ['LED0603', 1.6, 0.8],
    ['R0805', 2.0, 1.25], ['C0805', 2.0, 1.25],
    ['C1206', 3.2, 1.6], ['C1210', 3.2, 2.5], ['R2512', 6.3, 3.2],
  ])('%s is %s × %s mm (EIA-198 / IEC 60115-8 size codes, from memory)', (n, L, W) => {
    expect([body(n).length, body(n).width]).toEqual([L, W]);
  });
  test('SOT-23 2.9 × 1.3 (JEDEC TO-236, from memory) and SOIC-8 4.9 × 3.9 (JEDEC MS-012, from memory)', () => {
    expect([body('SOT-23').length, body('SOT-23').width]).toEqual([2.9, 1.3]);
    expect([body('SOIC-8').length, body('SOIC-8').width]).toEqual([4.9, 3.9]);
  });
  test('every package nozzle and preset exists in the library', () => {
    const nz = new Set(lib.nozzles.map((n) => n.name)), vp = new Set(lib.visionPresets.map((v) => v.name));
    for (const p of lib.packages) {
      for (const n of p.nozzles) expect(nz.has(n), `${p.name} nozzle ${n}`).toBe(true);
      if (p.vision) expect(vp.has(p.vision), `${p.name} vision ${p.vision}`).toBe(true);
    }
  });
});
