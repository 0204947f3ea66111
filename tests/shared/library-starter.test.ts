import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { STARTER_LIBRARY } from '../../server/db/seed/starter-library.data';
import { parseLibraryFile } from '../../server/modules/library/library-file';
import { PackageMatcher } from '../../shared/library';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { packageWarnings, tapeProblem } from '../../shared/schemas/library.schema';

const lib = libraryFileSchema.parse(STARTER_LIBRARY);
const byName = new Map(lib.packages.map((p) => [p.name, p]));

describe('starter library', () => {
  it('holds at least 60 packages, all valid, with nothing that does not parse', () => {
    const { value, errors } = parseLibraryFile(STARTER_LIBRARY);
    expect(errors).toEqual([]);
    expect(value.packages.length).toBeGreaterThanOrEqual(60);
  });

  // EIA-198 / IEC 60115-8 size codes, from memory: nominal L × W in mm.
  it.each([
    ['01005', 0.4, 0.2],
    ['0201', 0.6, 0.3],
    ['0402', 1.0, 0.5],
    ['0603', 1.6, 0.8],
    ['0805', 2.0, 1.25],
    ['1206', 3.2, 1.6],
    ['1210', 3.2, 2.5],
    ['2010', 5.0, 2.5],
    ['2512', 6.3, 3.2],
  ])('chip %s is %s × %s mm (resistor, and capacitor where there is one)', (code, l, w) => {
    const r = byName.get(`R${code}`);
    expect(r?.body).toMatchObject({ length: l, width: w });
    const c = byName.get(`C${code}`);
    if (c) expect(c.body).toMatchObject({ length: l, width: w });
  });

  it('SOT-23 and SOIC-8 bodies as shared/README.md, "Check values and their sources" gives them (JEDEC TO-236 and MS-012, from memory)', () => {
    expect(byName.get('SOT-23')!.body).toMatchObject({ length: 2.9, width: 1.3 });
    expect(byName.get('SOIC-8')!.body).toMatchObject({ length: 4.9, width: 3.9 });
  });

  it('every tape is an EIA-481 width with a pitch that suits it (from memory)', () => {
    for (const p of lib.packages) if (p.tape) expect([p.name, tapeProblem(p.tape.width, p.tape.pitch)]).toEqual([p.name, null]);
  });

  it('no listed nozzle has a tip wider than its package body’s smaller side (common practice)', () => {
    const { value } = parseLibraryFile(STARTER_LIBRARY);
    for (const p of value.packages) expect([p.name, packageWarnings(p, value.nozzles)]).toEqual([p.name, []]);
  });

  it('the demo machines reach 400 × 400 mm (common practice)', () => {
    for (const m of STARTER_LIBRARY.machines) expect([m.reachX, m.reachY]).toEqual([400, 400]);
  });

  it('every source is named in the package notes', () => {
    for (const p of STARTER_LIBRARY.packages) expect(p.notes, p.name).toMatch(/^Sources: body .*(from memory|common practice)/);
  });

  it('matches every footprint of the demo centroid files (the planted TERMBLOCK-5MM excepted)', () => {
    const matcher = new PackageMatcher(lib.packages);
    const sample = libraryFileSchema.parse(JSON.parse(readFileSync('samples/library.json', 'utf8')));
    const sampleMatcher = new PackageMatcher(sample.packages);
    const footprints = new Set<string>();
    for (const f of ['samples/weather-station/weather-ctl.csv', 'samples/led-strip/led-strip.csv', 'samples/faulty/faulty.csv']) {
      const lines = readFileSync(f, 'utf8').replace(/^\uFEFF/, '').split(/\r?\n/);
      const h = lines.findIndex((l) => /(^|[;,])(Package|Footprint)([;,]|$)/.test(l));
      const sep = lines[h].includes(';') ? ';' : ',';
      const col = lines[h].split(sep).findIndex((c) => c === 'Package' || c === 'Footprint');
      for (const l of lines.slice(h + 1)) if (l.trim()) footprints.add(l.split(sep)[col]);
    }
    expect(footprints.size).toBeGreaterThan(20);
    for (const fp of footprints) {
      if (fp === 'TERMBLOCK-5MM') {
        expect(matcher.match(fp).pkg).toBeNull();
        continue;
      }
      // the same package the sample library picks
      expect([fp, matcher.match(fp).pkg?.name]).toEqual([fp, sampleMatcher.match(fp).pkg?.name]);
    }
  });
});
