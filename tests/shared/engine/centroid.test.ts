import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { importCentroid } from '../../../shared/centroid';
import { analyseHeader } from '../../../shared/centroid';
import { parseFlagCell, parseNumberCell, parseSideCell } from '../../../shared/centroid/values';
import { EngineInputError } from '../../../shared/core';

function catchErr(fn: () => unknown): EngineInputError {
  try {
    fn();
  } catch (e) {
    if (e instanceof EngineInputError) return e;
    throw e;
  }
  throw new Error('expected an EngineInputError');
}

describe('header recognition', () => {
  test.each([
    ['Ref', 'ref'], ['RefDes', 'ref'], ['Designator', 'ref'], ['Reference', 'ref'], ['ref-des', 'ref'],
    ['X', 'x'], ['PosX', 'x'], ['Mid X', 'x'], ['Center-X', 'x'], ['Ref X', 'x'], ['Loc X', 'x'], ['pos_x', 'x'],
    ['Y', 'y'], ['PosY', 'y'], ['Mid Y', 'y'], ['Center-Y', 'y'], ['Ref Y', 'y'], ['Loc Y', 'y'],
    ['Rot', 'rotation'], ['Rotation', 'rotation'], ['Angle', 'rotation'], ['Orientation', 'rotation'],
    ['Side', 'side'], ['Layer', 'side'], ['TB', 'side'], ['Top/Bottom', 'side'],
    ['Footprint', 'footprint'], ['Package', 'footprint'], ['Pattern', 'footprint'], ['Case', 'footprint'],
    ['Value', 'value'], ['Val', 'value'], ['Comment', 'value'],
    ['MPN', 'partNumber'], ['Part Number', 'partNumber'], ['PN', 'partNumber'], ['Manufacturer Part', 'partNumber'],
    ['DNP', 'dnp'], ['DNI', 'dnp'], ['Fitted', 'dnp'], ['Populate', 'dnp'],
  ])('%s → %s', (h, f) => expect(analyseHeader(h).field).toBe(f));

  test.each([
    ['X(mil)', 'x', 'mil'],
    ['PosX [in]', 'x', 'in'],
    ['Center-X(mm)', 'x', 'mm'],
    ['Mid X mm', 'x', 'mm'],
    ['Mid Y(mil)', 'y', 'mil'],
    ['PosY', 'y', null],
  ])('unit suffix %s → %s in %s', (h, f, u) => {
    const a = analyseHeader(h);
    expect(a.field).toBe(f);
    expect(a.unit).toBe(u);
  });
  test('Fitted and Populate invert the meaning', () => {
    expect(analyseHeader('Fitted').invertedDnp).toBe(true);
    expect(analyseHeader('DNP').invertedDnp).toBe(false);
  });
});

describe('cell values', () => {
  test.each([
    ['12.5', false, 12.5, null],
    ['-3', false, -3, null],
    ['12,5', true, 12.5, null],
    ['12.5mm', false, 12.5, 'mm'],
    ['1250mil', false, 1250, 'mil'],
    ['0.5 in', false, 0.5, 'in'],
    [' 7 ', false, 7, null],
  ])('number %j (decimal comma %s)', (s, dc, v, u) => {
    expect(parseNumberCell(s, dc)).toEqual({ value: v, unit: u });
  });
  test.each(['', 'abc', '12,5', '0x10', 'Infinity', '1.2.3'])('not a number: %j', (s) => {
    expect(parseNumberCell(s, false)).toBeNull();
  });
  test.each([
    ['top', 'top'], ['Bottom', 'bottom'], ['T', 'top'], ['b', 'bottom'], ['TOP', 'top'], ['bot', 'bottom'],
    ['Front', 'top'], ['back', 'bottom'], ['F', 'top'], ['B', 'bottom'], ['component', 'top'], ['solder', 'bottom'],
    ['Top Layer', 'top'], ['BottomLayer', 'bottom'],
  ])('side %s → %s', (s, want) => expect(parseSideCell(s)).toBe(want));
  test('unknown side', () => expect(parseSideCell('middle')).toBeNull());
  test.each([
    ['yes', true], ['no', false], ['TRUE', true], ['false', false], ['1', true], ['0', false], ['x', true], ['', false],
  ])('flag %j → %s', (s, want) => expect(parseFlagCell(s)).toBe(want));
});

describe('dialects', () => {
  test('comma, mm from --units, LF', () => {
    const r = importCentroid('Ref,Val,Package,PosX,PosY,Rot,Side\nR1,10k,R0402,10.5,20.25,90,top\nC1,100n,C0402,1,2,-90,bottom\n', {
      units: 'mm',
    });
    expect(r.dialect).toMatchObject({ delimiter: ',', decimalComma: false, headerLine: 1, bom: false, lineEnding: '\n', unitsSource: 'option' });
    expect(r.placements).toHaveLength(2);
    expect(r.placements[0]).toMatchObject({ ref: 'R1', x: 10.5, y: 20.25, rotation: 90, side: 'top', footprint: 'R0402', value: '10k', line: 2 });
    expect(r.placements[1].rotation).toBe(270); // −90 normalised to [0, 360)
    expect(r.columns).toEqual({ ref: 'Ref', value: 'Val', footprint: 'Package', x: 'PosX', y: 'PosY', rotation: 'Rot', side: 'Side' });
  });

  test('semicolon, decimal comma, mil header, BOM, CRLF, preamble', () => {
    const text = '\uFEFFExported placement data;rev A\r\n\r\nDesignator;Footprint;Mid X(mil);Mid Y(mil);Rotation;Layer;Comment\r\nD1;LED;1250,5;100;180;Top;red\r\n';
    const r = importCentroid(text);
    expect(r.dialect).toMatchObject({ delimiter: ';', decimalComma: true, headerLine: 3, bom: true, lineEnding: '\r\n', unitsSource: 'header' });
    expect(r.units).toBe('mil');
    // 1250.5 mil × 0.0254 mm/mil = 31.7627 mm; 100 mil = 2.54 mm (NIST SP 811)
    expect(r.placements[0].x).toBeCloseTo(31.7627, 9);
    expect(r.placements[0].y).toBeCloseTo(2.54, 12);
    expect(r.placements[0].line).toBe(4);
    expect(r.warnings.find((w) => w.code === 'units-inferred')?.line).toBe(3);
  });

  test('tab delimiter, quoted fields, inch header', () => {
    const r = importCentroid('RefDes\tPosX [in]\tPosY [in]\tAngle\tPattern\tValue\n"R1"\t1.5\t"0.5"\t45\tR0603\t"10k, 1%"\n');
    expect(r.dialect.delimiter).toBe('\t');
    // 1.5 in = 38.1 mm, 0.5 in = 12.7 mm (NIST SP 811)
    expect(r.placements[0]).toMatchObject({ ref: 'R1', rotation: 45, value: '10k, 1%' });
    expect(r.placements[0].x).toBeCloseTo(38.1, 12);
    expect(r.placements[0].y).toBeCloseTo(12.7, 12);
  });

  test('quoted comma-delimited value with a decimal comma', () => {
    const r = importCentroid('Ref,X,Y,Rot\nR1,"1,5","2,5",0\n', { units: 'mm' });
    expect(r.dialect.decimalComma).toBe(true);
    expect(r.placements[0]).toMatchObject({ x: 1.5, y: 2.5 });
  });

  test('units from value suffixes, with a warning naming the line', () => {
    const r = importCentroid('Ref,X,Y,Rot\nR1,12.5mm,3mm,0\n');
    expect(r.units).toBe('mm');
    expect(r.dialect.unitsSource).toBe('values');
    expect(r.warnings.find((w) => w.code === 'units-inferred')?.line).toBe(2);
  });

  test('--units overrides the header with a warning', () => {
    const r = importCentroid('Ref,X(mil),Y(mil),Rot\nR1,100,100,0\n', { units: 'mm' });
    expect(r.placements[0].x).toBe(100);
    expect(r.warnings.some((w) => w.code === 'units-override')).toBe(true);
  });

  test('comment lines in the data and blank lines are skipped, line numbers physical', () => {
    const r = importCentroid('# made by hand\nRef,X,Y,Rot\n\n# a note\nR1,1,1,0\n\nR2,2,2,0\n', { units: 'mm' });
    expect(r.placements.map((p) => p.line)).toEqual([5, 7]);
  });

  test('a quoted newline keeps later line numbers physical', () => {
    const r = importCentroid('Ref,X,Y,Rot,Value\nR1,1,1,0,"two\nlines"\nR2,x,1,0,v\n'.replace(',x,', ',2,'), { units: 'mm' });
    expect(r.placements[1].line).toBe(4);
  });

  test('rotations normalised, bottom conventions', () => {
    const text = 'Ref,X,Y,Rot,Side\nA,0,0,30,bottom\nB,0,0,400,top\n';
    expect(importCentroid(text, { units: 'mm' }).placements.map((p) => p.rotation)).toEqual([30, 40]);
    expect(importCentroid(text, { units: 'mm', bottomRotation: 'negate' }).placements[0].rotation).toBe(330); // −30
    expect(importCentroid(text, { units: 'mm', bottomRotation: 'mirror-180' }).placements[0].rotation).toBe(150); // 180 − 30
    // top parts are never converted
    expect(importCentroid(text, { units: 'mm', bottomRotation: 'negate' }).placements[1].rotation).toBe(40);
  });

  test('DNP and inverted Fitted columns', () => {
    const a = importCentroid('Ref,X,Y,Rot,DNP\nR1,0,0,0,x\nR2,0,0,0,\n', { units: 'mm' });
    expect(a.placements.map((p) => p.dnp)).toEqual([true, false]);
    const b = importCentroid('Ref,X,Y,Rot,Fitted\nR1,0,0,0,Yes\nR2,0,0,0,No\n', { units: 'mm' });
    expect(b.placements.map((p) => p.dnp)).toEqual([false, true]);
    expect(b.dialect.dnpSense).toBe('fitted');
  });

  test('--map names a column the families do not know', () => {
    const r = importCentroid('Part,Xpos,Ypos,Turn\nR1,1,2,90\n', { units: 'mm', map: { ref: 'Part', rotation: 'Turn' } });
    expect(r.placements[0]).toMatchObject({ ref: 'R1', rotation: 90 });
    expect(r.columns).toMatchObject({ ref: 'Part', rotation: 'Turn', x: 'Xpos' });
    // without the map, "Part" is not taken for the reference (it often means a part number)
    expect(() => importCentroid('Part,Xpos,Ypos,Turn\nR1,1,2,90\n', { units: 'mm' })).toThrow(EngineInputError);
  });

  test('no side column: all top, with a warning', () => {
    const r = importCentroid('Ref,X,Y,Rot\nR1,1,2,0\n', { units: 'mm' });
    expect(r.placements[0].side).toBe('top');
    expect(r.warnings.some((w) => w.code === 'no-side')).toBe(true);
  });
});

describe('bad input names the line and the column', () => {
  test('duplicate reference', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,1,2,0\nR2,1,2,0\nR1,3,4,0\n', { units: 'mm', file: 'b.csv' }));
    expect(e).toMatchObject({ line: 4, column: 'Ref', code: 'duplicate-ref', file: 'b.csv' });
    expect(e.message).toMatch(/^b\.csv:4, column "Ref": duplicate reference "R1" \(first on line 2\)/);
  });
  test('non-numeric coordinate', () => {
    const e = catchErr(() => importCentroid('Ref,PosX,PosY,Rot\nR1,1,2,0\nR2,1,abc,0\n', { units: 'mm' }));
    expect(e).toMatchObject({ line: 3, column: 'PosY', code: 'bad-number' });
  });
  test('non-numeric rotation', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,1,2,up\n', { units: 'mm' }));
    expect(e).toMatchObject({ line: 2, column: 'Rot', code: 'bad-number' });
  });
  test('a comma in a number without decimal comma', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,"1,5",2,0\nR2,"1.5,0",2,0\n', { units: 'mm' }));
    expect(e.code).toBe('bad-number');
  });
  test('missing required column', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Value\nR1,1,2,10k\n', { units: 'mm' }));
    expect(e).toMatchObject({ line: 1, field: 'rotation', code: 'missing-column' });
  });
  test('missing Y column', () => {
    const e = catchErr(() => importCentroid('Ref,X,Rot,Value\nR1,1,2,10k\n', { units: 'mm' }));
    expect(e).toMatchObject({ line: 1, field: 'y', code: 'missing-column' });
  });
  test('empty file', () => {
    expect(catchErr(() => importCentroid('', { units: 'mm' })).code).toBe('empty');
    expect(catchErr(() => importCentroid('\n\n  \n', { units: 'mm' })).code).toBe('empty');
    expect(catchErr(() => importCentroid('Ref,X,Y,Rot\n\n\n', { units: 'mm' }))).toMatchObject({ code: 'empty', line: 1 });
  });
  test('units cannot be told', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,1,2,0\n'));
    expect(e).toMatchObject({ code: 'no-units', line: 1, column: 'X' });
  });
  test('a plain value among suffixed ones', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,1mm,2mm,0\nR2,3,4mm,0\n'));
    expect(e).toMatchObject({ code: 'no-units', line: 3 });
  });
  test('unrecognised side', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot,Layer\nR1,1,2,0,Top\nR2,1,2,0,Inner3\n', { units: 'mm' }));
    expect(e).toMatchObject({ line: 3, column: 'Layer', code: 'bad-side' });
  });
  test('unrecognised DNP value', () => {
    const e = catchErr(() => importCentroid('Ref,X,Y,Rot,DNP\nR1,1,2,0,maybe\n', { units: 'mm' }));
    expect(e).toMatchObject({ line: 2, column: 'DNP', code: 'bad-flag' });
  });
  test('empty reference', () => {
    expect(catchErr(() => importCentroid('Ref,X,Y,Rot\n ,1,2,0\n', { units: 'mm' }))).toMatchObject({ line: 2, code: 'empty-ref' });
  });
  test('short row', () => {
    expect(catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,1\n', { units: 'mm' }))).toMatchObject({ line: 2, code: 'short-row' });
  });
  test('no header row', () => {
    expect(catchErr(() => importCentroid('a,b,c\n1,2,3\n', { units: 'mm' })).code).toBe('no-header');
  });
  test('--map to a header that is not there', () => {
    expect(catchErr(() => importCentroid('Ref,X,Y,Rot\nR1,1,2,0\n', { units: 'mm', map: { value: 'Wert' } }))).toMatchObject({
      field: 'map.value',
      code: 'bad-map',
    });
  });
  test('X and Y in different units', () => {
    expect(catchErr(() => importCentroid('Ref,X(mm),Y(mil),Rot\nR1,1,2,0\n')).code).toBe('unit-conflict');
  });
});

describe('properties', () => {
  test('any rotation imports into [0, 360) and re-importing is idempotent', () => {
    fc.assert(
      fc.property(fc.double({ min: -3600, max: 3600, noNaN: true }), (rot) => {
        const a = importCentroid(`Ref,X,Y,Rot\nR1,0,0,${rot}\n`, { units: 'mm' }).placements[0].rotation;
        expect(a).toBeGreaterThanOrEqual(0);
        expect(a).toBeLessThan(360);
        const b = importCentroid(`Ref,X,Y,Rot\nR1,0,0,${a}\n`, { units: 'mm' }).placements[0].rotation;
        expect(b).toBe(a);
      }),
      { numRuns: 200 },
    );
  });
  test('same coordinates whatever the dialect', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x: fc.integer({ min: -99999, max: 99999 }), y: fc.integer({ min: -99999, max: 99999 }) }), { minLength: 1, maxLength: 20 }),
        (pts) => {
          const comma = ['Ref,X,Y,Rot', ...pts.map((p, i) => `R${i + 1},${p.x / 100},${p.y / 100},0`)].join('\n');
          const semi = ['junk line', 'Designator;Mid X;Mid Y;Rotation', ...pts.map((p, i) => `R${i + 1};${String(p.x / 100).replace('.', ',')};${String(p.y / 100).replace('.', ',')};0`)].join('\r\n');
          const a = importCentroid(comma, { units: 'mm' }).placements;
          const b = importCentroid(semi, { units: 'mm' }).placements;
          expect(b.map((p) => [p.ref, p.x, p.y])).toEqual(a.map((p) => [p.ref, p.x, p.y]));
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe('duplicate detection at scale (property)', () => {
  test('a planted duplicate among many references is found on its line', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 3000 }), fc.nat(), fc.nat(), (n, a, b) => {
        const first = a % n;
        let second = b % n;
        if (second === first) second = (second + 1) % n;
        const [lo, hi] = first < second ? [first, second] : [second, first];
        const refs = Array.from({ length: n }, (_, i) => `R${i}`);
        refs[hi] = refs[lo];
        const text = ['Ref,X,Y,Rot', ...refs.map((r) => `${r},1,1,0`)].join('\n');
        let e: unknown;
        try {
          importCentroid(text, { units: 'mm' });
        } catch (x) {
          e = x;
        }
        expect(e).toBeInstanceOf(EngineInputError);
        expect((e as EngineInputError).line).toBe(hi + 2);
        expect((e as EngineInputError).message).toContain(`first on line ${lo + 2}`);
      }),
      { numRuns: 40 },
    );
  });
  test('many distinct references import without a false duplicate', () => {
    const text = ['Ref,X,Y,Rot', ...Array.from({ length: 20000 }, (_, i) => `U${i},1,1,0`)].join('\n');
    expect(importCentroid(text, { units: 'mm' }).placements).toHaveLength(20000);
  });
});

describe('import result: records and table', () => {
  const text = 'Ref,X,Y,Rot,Side,DNP\nR1,1,2,90,top,\nR2,3,4,10,bottom,x\n';
  test('the table and the records describe the same rows', () => {
    const r = importCentroid(text, { units: 'mm' });
    const t = r.table!;
    expect(t.count).toBe(2);
    expect([t.ref, Array.from(t.x), Array.from(t.bottom), Array.from(t.dnp), Array.from(t.line)]).toEqual([['R1', 'R2'], [1, 3], [0, 1], [0, 1], [2, 3]]);
    expect(r.placements.map((p) => [p.ref, p.x, p.side, p.dnp, p.line])).toEqual([['R1', 1, 'top', false, 2], ['R2', 3, 'bottom', true, 3]]);
  });
  test('JSON carries the records, not the table; reading the records drops the table', () => {
    const r = importCentroid(text, { units: 'mm' });
    expect(Object.keys(r)).not.toContain('table');
    const json = JSON.parse(JSON.stringify(r));
    expect(json.placements).toHaveLength(2);
    expect(json.table).toBeUndefined();
    expect(r.table).toBeUndefined(); // JSON.stringify read the records
  });
});

describe('fast decimal parsing gives the same double as the engine', () => {
  test('plainNumber(s) === +s for decimal strings (property)', async () => {
    const { plainNumber } = await import('../../../shared/centroid/values');
    fc.assert(
      fc.property(fc.double({ min: -1e7, max: 1e7, noNaN: true }), fc.integer({ min: 0, max: 9 }), (v, d) => {
        const s = v.toFixed(d);
        expect(Object.is(plainNumber(s), +s) || (plainNumber(s) === 0 && +s === 0)).toBe(true);
      }),
      { numRuns: 2000 },
    );
    for (const s of ['1e3', '-0.5', '+2', '.5', '5.', '007', '123456789012345678', '1.5.2', '-', '', '1,5', '12mm']) {
      // '+2' and '.5' are numbers to the importer as well (the full parser accepts them too)
      const want = s === '1.5.2' || s === '-' || s === '' || s === '1,5' || s === '12mm' ? NaN : +s;
      if (Number.isNaN(want)) expect(plainNumber(s)).toBeNaN();
      else expect(plainNumber(s)).toBe(want);
    }
  });
});
