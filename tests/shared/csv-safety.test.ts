import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvField, csvRow, firstFormulaCell, formulaCellProblem, formulaTrigger, neutraliseCell, unneutraliseCell } from '../../shared/csv-safety';

// The triggers and the remedy are those of the OWASP "CSV Injection" page: cells starting with
// = + - @ tab or carriage return; prefix a single quote and wrap the cell in double quotes.
describe('spreadsheet formula cells', () => {
  it.each([
    ["=cmd|' /C calc'!A0", '='],
    ['=HYPERLINK("http://x.example","click")', '='],
    ['+1+cmd', '+'],
    ['-2+3+cmd', '-'],
    ['@SUM(1+1)*cmd', '@'],
    ['\t=1+1', '\t'],
    ['\r=1+1', '\r'],
    ['-A1', '-'],
    ['+5V', '+'],
  ])('%j starts a formula (%j)', (cell, trigger) => {
    expect(formulaTrigger(cell)).toBe(trigger);
    expect(formulaCellProblem(cell)).toMatch(/spreadsheet would run it as a formula|spreadsheet would run as a formula/);
  });

  it.each(['R1', 'C0603', '10k', '-1.5', '+3', '-0,25', '1e-3', '-', '+', '', 'A=B', 'x@y', "'quoted"])('%j is plain text or a number', (cell) => {
    expect(formulaTrigger(cell)).toBeNull();
    expect(formulaCellProblem(cell)).toBeNull();
  });

  it('the import message names the character and quotes the cell', () => {
    expect(formulaCellProblem('=HYPERLINK("http://x.example")')).toBe('"=HYPERLINK("http://x.example")" starts with "=", which a spreadsheet would run as a formula; remove that character (or write the text another way) and import again');
  });

  it('export: formula cells get a leading quote and are quoted; others keep RFC 4180 minimal quoting', () => {
    expect(csvField("=cmd|' /C calc'!A0")).toBe(`"'=cmd|' /C calc'!A0"`);
    expect(csvField('=HYPERLINK("http://x.example")')).toBe(`"'=HYPERLINK(""http://x.example"")"`);
    expect(csvField('@x')).toBe(`"'@x"`);
    expect(csvField('R1')).toBe('R1');
    expect(csvField('-1.5')).toBe('-1.5');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('a;b', ';')).toBe('"a;b"');
    expect(csvRow(['R1', 1.5, null, '=1+1'])).toBe(`R1,1.5,,"'=1+1"`);
  });

  it('property: no field written ever reads back as a formula, and un-neutralising gives the cell back', () => {
    const cell = fc.oneof(fc.string(), fc.constantFrom('=', '+', '-', '@', '\t', '\r').chain((c) => fc.string().map((s) => c + s)));
    fc.assert(
      fc.property(fc.array(cell, { minLength: 1, maxLength: 6 }), (cells) => {
        const line = csvRow(cells);
        const parsed = Papa.parse<string[]>(line + '\n', { delimiter: ',', newline: '\n', skipEmptyLines: false }).data[0];
        expect(parsed).toHaveLength(cells.length);
        parsed.forEach((got, i) => {
          expect(formulaTrigger(got)).toBeNull();
          // (a cell that itself began with ' and a trigger cannot be told from a neutralised one)
          if (!(cells[i][0] === "'" && formulaTrigger(cells[i].slice(1)))) expect(unneutraliseCell(got)).toBe(cells[i]);
          expect(got).toBe(neutraliseCell(cells[i]));
        });
      }),
      { numRuns: 2000 },
    );
  });

  it('firstFormulaCell finds each trigger in the given columns (after trimming), and agrees with formulaTrigger', () => {
    for (const cell of ['=1', '+x', '-x', '@x', '  =1', '\t=1', ' @x']) expect(firstFormulaCell(['R1', cell], 0, 1), JSON.stringify(cell)).toMatchObject({ index: 1 });
    expect(firstFormulaCell(['=1', 'ok'], -1, 1)).toBeNull();
    fc.assert(
      fc.property(fc.string(), (cell) => {
        const found = firstFormulaCell([cell], 0);
        expect(found !== null).toBe(formulaTrigger(cell.trim()) !== null);
      }),
      { numRuns: 5000 },
    );
  });
});
