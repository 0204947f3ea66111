import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { importCentroid, importCentroidCollecting } from '../../../shared/centroid';
import { runRevision } from '../../../shared/engine';
import { nameKey, unmatchedFootprints } from '../../../shared/library';
import { placementRecords } from '../../../shared/core';
import { writePlacementListCsv } from '../../../shared/placement-list';
import { jobSchema } from '../../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../../shared/schemas/library-file.schema';
import { job, loadSampleLibrary, samplePath } from './helpers';

const csv = ['Ref,X,Y,Rot,Side,Package', 'R1,20,23,0,top,R0603', 'R2,30,23,0,top,R0603', 'U1,40,30,0,top,MYSTERY', 'C1,20,23,0,bottom,R0603'].join('\n');

const library = libraryFileSchema.parse({
  format: 'placewright-library/1',
  packages: [
    { name: 'R0603', body: { length: 1.6, width: 0.8, height: 0.45 }, nozzles: ['N07'], vision: 'chip-small' },
    { name: 'SOIC-8', body: { length: 4.9, width: 3.9, height: 1.75 }, nozzles: ['N14'], vision: 'lead-row' },
  ],
  nozzles: [{ name: 'N07', tipOuter: 0.7, holderRadius: 2.5 }, { name: 'N14', tipOuter: 1.4, holderRadius: 3.5 }],
  visionPresets: [{ name: 'chip-small', method: 'body' }, { name: 'lead-row', method: 'leads' }],
});

const base = {
  board: { originX: 10, originY: 20, width: 60, height: 40 },
  panel: { width: 80, height: 60, instances: [{ x: 10, y: 10 }] },
  machine: { reachX: 400, reachY: 400, nozzles: ['n07', 'N14'] },
};

describe('runRevision: the engine entry', () => {
  test('imports once, runs the sides with parts and checks them together', () => {
    const r = runRevision({ job: job(base), centroidText: csv, library });
    expect(r.runs.map((x) => x.side)).toEqual(['top', 'bottom']);
    expect(r.runs[0].import).toBe(r.runs[1].import); // one import shared by both sides
    expect(r.check?.summary.placements).toBe(4);
    expect(r.check?.findings.filter((f) => f.kind === 'no-package').map((f) => f.refs)).toEqual([['1:U1']]);
    expect(r.unmatched).toEqual([{ footprint: 'MYSTERY', count: 1 }]);
  });

  test('a top-only board runs the top side only; sides and check can be chosen', () => {
    const top = ['Ref,X,Y,Rot,Side,Package', 'R1,20,23,0,top,R0603'].join('\n');
    expect(runRevision({ job: job(base), centroidText: top, library }).runs.map((x) => x.side)).toEqual(['top']);
    const both = runRevision({ job: job(base), centroidText: top, library, sides: 'both', check: false });
    expect(both.runs.map((x) => x.side)).toEqual(['top', 'bottom']);
    expect(both.check).toBeNull();
  });

  test('each distinct warning once, though both sides carry the import warnings', () => {
    const noUnits = job({ ...base, import: {} });
    const r = runRevision({ job: noUnits, centroidText: csv.replace('Ref,X,Y', 'Ref,X(mm),Y(mm)'), library });
    expect(r.warnings.filter((w) => w.code === 'units-inferred')).toHaveLength(1);
  });
});

describe('overrides: part of the job, applied before the placements are built', () => {
  const overridden = job({
    ...base,
    overrides: {
      R1: { package: 'soic-8', reason: 'substituted by purchasing' },
      R2: { nozzle: ' n14 ', reason: 'worn tip' },
      C1: { vision: 'LEAD-ROW', reason: 'shiny part' },
    },
  });
  const r = runRevision({ job: overridden, centroidText: csv, library });
  const top = placementRecords(r.runs[0].placements);
  const bottom = placementRecords(r.runs[1].placements);
  const byRef = new Map([...top, ...bottom].map((p) => [p.ref, p]));

  test('a package override brings its body, nozzle and preset; the footprint stays as in the file', () => {
    expect(byRef.get('R1')).toMatchObject({ packageName: 'SOIC-8', footprint: 'R0603', bodyLength: 4.9, bodyWidth: 3.9, nozzle: 'N14', holderRadius: 3.5, vision: 'lead-row' });
  });
  test('a nozzle override brings its holder radius; names are compared without case or spaces', () => {
    expect(byRef.get('R2')).toMatchObject({ packageName: 'R0603', nozzle: 'N14', holderRadius: 3.5, vision: 'chip-small' });
  });
  test('a vision override replaces the preset, spelled as the library spells it', () => {
    expect(byRef.get('C1')).toMatchObject({ packageName: 'R0603', nozzle: 'N07', vision: 'lead-row' });
  });
  test('the machine list is compared with the same rule (n07 on the machine is N07)', () => {
    expect(byRef.get('U1')).toMatchObject({ packageName: null, nozzle: null });
    expect(runRevision({ job: job(base), centroidText: csv, library }).runs[0].placements.nozzle[0]).toBe('N07');
  });
  test('unknown names and references are warnings, and the part keeps the library choice', () => {
    const bad = job({ ...base, overrides: { R1: { nozzle: 'N99', reason: 'typo test' }, R7: { vision: 'chip-small', reason: 'gone' } } });
    const res = runRevision({ job: bad, centroidText: csv, library });
    expect(res.runs[0].placements.nozzle[0]).toBe('N07');
    expect(res.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['override-unknown-name', 'override-unknown-ref']));
    expect(res.warnings.find((w) => w.code === 'override-unknown-name')?.message).toMatch(/R1.*"N99"/);
  });
  test('an override names at least one thing, with a reason', () => {
    expect(() => jobSchema.parse({ ...overridden, overrides: { R1: { reason: 'nothing to change' } } })).toThrow(/at least one/);
    expect(() => jobSchema.parse({ ...overridden, overrides: { R1: { nozzle: 'N07' } } })).toThrow();
  });
  test('unmatched footprints follow the same rules (an overridden part is matched)', () => {
    const imported = importCentroid(csv, { units: 'mm' });
    expect(unmatchedFootprints(imported.placements, library)).toEqual([{ footprint: 'MYSTERY', count: 1 }]);
    expect(unmatchedFootprints(imported.placements, library, { U1: { package: 'R0603', reason: 'it is a resistor' } })).toEqual([]);
  });
  test('nameKey: one rule', () => {
    expect(nameKey('  N07 ')).toBe(nameKey('n07'));
    expect(nameKey('N07')).not.toBe(nameKey('N070'));
  });
});

describe('the overrides sample', () => {
  test('job-overrides.json lists one of each kind and the list shows them', async () => {
    const j = jobSchema.parse(JSON.parse(readFileSync(samplePath('led-strip/job-overrides.json'), 'utf8')));
    const text = readFileSync(samplePath('led-strip/led-strip.csv'), 'utf8');
    const r = runRevision({ job: j, centroidText: text, library: loadSampleLibrary(), sides: ['top'], check: false });
    const { text: list } = await writePlacementListCsv(r.runs[0], { generated: '2026-01-01T00:00:00Z' });
    expect(list).toMatch(/,R3,[^\n]*,R0603,N07,chip-small,/);
    expect(list).toMatch(/,Q1,[^\n]*,SOT-23,N10,lead-row,/);
    expect(list).toMatch(/,D1,[^\n]*,LED0603,N07,chip-medium,/);
  });
});

describe('importCentroidCollecting: every bad row in one pass', () => {
  const bad = [
    '# exported by hand',
    'Ref,X(mm),Y(mm),Rot,Side,DNP',
    'R1,1,1,0,top,',
    'R2,abc,1,0,top,', // 4: bad number
    'R3,3,3,0,sideways,', // 5: bad side
    'R1,4,4,0,top,', // 6: duplicate of line 3
    ',5,5,0,top,', // 7: empty reference
    'R2,6,6,0,top,maybe', // 8: bad flag (R2 was bad on line 4, so it is not a duplicate)
    'R2,6,6,0,top,', // 9: good: the first good R2
    'R9,7,7,zz,top,', // 10: bad rotation
    'R10,8,8,0,bottom,',
  ].join('\n');

  test('lists them in file order with line and column, and imports the good rows', () => {
    const r = importCentroidCollecting(bad, {}, 100);
    expect(r.fileError).toBeNull();
    expect(r.rowErrors.map((e) => [e.line, e.column, e.code])).toEqual([
      [4, 'X(mm)', 'bad-number'],
      [5, 'Side', 'bad-side'],
      [6, 'Ref', 'duplicate-ref'],
      [7, 'Ref', 'empty-ref'],
      [8, 'DNP', 'bad-flag'],
      [10, 'Rot', 'bad-number'],
    ]);
    expect(r.imported?.placements.map((p) => p.ref)).toEqual(['R1', 'R2', 'R10']);
    expect(r.truncated).toBe(false);
  });
  test('the first collected error is the one the plain import throws', () => {
    const first = importCentroidCollecting(bad).rowErrors[0];
    expect(() => importCentroid(bad)).toThrow(first.message);
  });
  test('a cap keeps the first errors and counts the rest', () => {
    const r = importCentroidCollecting(bad, {}, 2);
    expect(r.rowErrors.map((e) => e.line)).toEqual([4, 5]);
    expect(r.truncated).toBe(true);
    expect(r.badRows).toBe(6);
  });
  test('a file-wide problem ends the reading and is returned, with the rows found bad before it', () => {
    const r = importCentroidCollecting(['Ref,X,Y,Rot', 'R1,1,1,0', 'R1,2,2,0'].join('\n'));
    expect(r.imported).toBeNull();
    expect(r.rowErrors.map((e) => e.line)).toEqual([3]);
    expect(r.fileError?.code).toBe('no-units');
  });
  test('a clean file gives the same import as the plain reader', () => {
    const text = readFileSync(samplePath('led-strip/led-strip.csv'), 'utf8');
    const r = importCentroidCollecting(text);
    expect(r.rowErrors).toEqual([]);
    expect(r.imported?.placements).toEqual(importCentroid(text).placements);
  });
});
