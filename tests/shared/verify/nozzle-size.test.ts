import { describe, expect, test } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../../server/cli';
import { runRevision } from '../../../shared/engine';
import { job } from '../engine/helpers';
import { libraryFileSchema } from '../../../shared/schemas/library-file.schema';
import { makeVerifyInput, verify } from '../../../shared/verify';

// Common practice: the nozzle tip should be no wider than the body's smaller side (the tip then
// seals on the body and does not press on leads or neighbours).
describe('nozzle-size: a tip wider than the body', () => {
  test('a 4 mm tip on a 1.0 × 0.5 mm part is a warning, 3.5 mm too wide', () => {
    const r = verify(makeVerifyInput([{ ref: 'R1', x: 10, y: 10, length: 1.0, width: 0.5, tipOuter: 4, nozzle: 'N40' }]));
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f).toMatchObject({ kind: 'nozzle-size', severity: 'warning', refs: ['1:R1'], geometry: { type: 'point', x: 10, y: 10 } });
    expect(f.depth).toBeCloseTo(3.5, 12);
    expect(f.message).toBe("R1 on board 1: the tip of nozzle N40 (⌀ 4.000 mm) is wider than the body's smaller side (0.500 mm)");
    expect(r.summary).toMatchObject({ errors: 0, warnings: 1 });
  });
  test('a tip equal to the smaller side, a smaller tip, an unknown tip: no finding', () => {
    const r = verify(makeVerifyInput([
      { ref: 'R1', x: 10, y: 10, length: 1.0, width: 0.5, tipOuter: 0.5 },
      { ref: 'R2', x: 20, y: 10, length: 1.0, width: 0.5, tipOuter: 0.3 },
      { ref: 'R3', x: 30, y: 10, length: 1.0, width: 0.5 },
    ]));
    expect(r.findings).toEqual([]);
  });
  test('a part without a nozzle is reported as no-nozzle only', () => {
    const r = verify(makeVerifyInput([{ ref: 'R1', x: 10, y: 10, length: 1.0, width: 0.5, tipOuter: 4, hasNozzle: false }]));
    expect(r.findings.map((f) => f.kind)).toEqual(['no-nozzle']);
  });

  const library = libraryFileSchema.parse({
    format: 'placewright-library/1',
    packages: [{ name: 'R0402', body: { length: 1.0, width: 0.5, height: 0.35 }, nozzles: ['N05'] }],
    nozzles: [{ name: 'N05', tipOuter: 0.5, holderRadius: 2 }, { name: 'N40', tipOuter: 4.0, holderRadius: 6 }],
  });
  const base = {
    board: { width: 30, height: 20 },
    panel: { width: 40, height: 30, instances: [{ x: 5, y: 5 }] },
    overrides: { R1: { nozzle: 'N40', reason: 'only tip on hand' } },
  };
  const csv = 'Ref,X,Y,Rot,Side,Package\nR1,10,10,0,top,R0402\nR2,20,10,0,top,R0402\n';

  test('through the engine: an override to a 4 mm tip on an R0402 gives the warning', () => {
    const r = runRevision({ job: job(base), centroidText: csv, library });
    expect(r.check!.findings.map((f) => [f.kind, f.refs[0]])).toEqual([['nozzle-size', '1:R1']]);
  });
  test('the command line check lists it (exit 0: a warning)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-nozzle-'));
    writeFileSync(join(dir, 'r.csv'), csv);
    writeFileSync(join(dir, 'lib.json'), JSON.stringify(library));
    writeFileSync(join(dir, 'job.json'), JSON.stringify({ ...base, centroid: 'r.csv', library: 'lib.json', import: { units: 'mm' } }));
    let out = '';
    const code = await main(['check', join(dir, 'job.json')], { stdout: (s) => (out += s), stderr: () => {} });
    expect(code).toBe(0);
    const res = JSON.parse(out);
    expect(res.findings.map((f: { kind: string }) => f.kind)).toEqual(['nozzle-size']);
    expect(res.summary).toMatchObject({ errors: 0, warnings: 1 });
  });
});
