import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { importCentroid, importCentroidCollecting } from '../../../shared/centroid';
import { EngineInputError } from '../../../shared/core';

/**
 * Issue "Reliability and scale": hostile centroid files through the import. 10,000 generated
 * files (random text and bytes, BOMs, NULs, huge fields, quotes, spreadsheet formulas, mixed
 * delimiters, duplicated headers, non-numeric coordinates, CR/LF/CRLF, empty lines) must never
 * raise anything but the engine's own input error, each row error with its line, and the
 * one-pass collecting import (the preview's) must agree with the import that stops at the first
 * bad row. Files are kept small so the run takes a few seconds.
 */

// Errors about one row (they carry the row's line) and about the whole file.
const ROW_CODES = new Set(['bad-flag', 'bad-number', 'bad-side', 'duplicate-ref', 'empty-ref', 'formula-cell', 'short-row']);
const FILE_CODES = new Set(['empty', 'no-header', 'missing-column', 'unit-conflict', 'no-units']);
// Whole-file errors that have no line to name: nothing in the file looks like a header.
const NO_LINE_CODES = new Set(['empty', 'no-header']);

const headerCell = fc.constantFrom(
  'Ref', 'Designator', 'RefDes', 'X', 'Y', 'X(mm)', 'Y(mm)', 'Mid X(mil)', 'Mid Y(mil)', 'PosX', 'PosY', 'Rot', 'Rotation', 'Side', 'Layer',
  'Footprint', 'Package', 'Value', 'Val', 'Part Number', 'DNP', 'Fitted', 'X(in)', 'Y(in)', 'Comment', '', '"Ref"', '"X, mm"',
);
const hostileCell = fc.oneof(
  fc.constantFrom('', ' ', 'abc', 'NaN', 'Infinity', '-', '+', '1e309', '-0', '0x10', '1,5', '1.5mm', '2mil', '3in', '12.5 mm', 'top', 'bottom', 'B', 'T', 'yes', 'no', 'maybe'),
  // spreadsheet formulas and the characters the OWASP "CSV Injection" guidance lists
  fc.constantFrom('=1+2', "=cmd|' /C calc'!A0", '=HYPERLINK("http://x","y")', '+SUM(A1)', '-x', '@SUM(1)', '\tR1', '\rR1', '=', '@'),
  // quotes, balanced and not
  fc.constantFrom('"', '""', '"a""b"', '"R1', 'R1"', '"1,5"', '"line\nbreak"', "'"),
  fc.double({ noNaN: false }).map(String),
  fc.integer({ min: -1e6, max: 1e6 }).map(String),
  fc.string({ maxLength: 12 }),
  fc.string({ unit: 'binary', maxLength: 8 }),
  fc.constantFrom('\u0000', 'R\u0000', '\uFEFF', '\uFFFD', 'Ω', '𝑥'),
);
// a huge field (at most one a file, to keep the run short)
const hugeCell = fc.integer({ min: 1000, max: 5000 }).map((n) => 'x'.repeat(n));
const delimiter = fc.constantFrom(',', ';', '\t', '|', ' ');
const lineEnding = fc.constantFrom('\n', '\r\n', '\r');

/** A file that looks like a centroid file, then is spoiled. */
const centroidLike = fc
  .record({
    bom: fc.boolean(),
    preamble: fc.array(fc.constantFrom('', '# exported', 'Units: mm', ';comment', '  '), { maxLength: 3 }),
    header: fc.array(headerCell, { minLength: 1, maxLength: 9 }),
    rows: fc.array(fc.array(hostileCell, { maxLength: 10 }), { maxLength: 14 }),
    delim: delimiter,
    // a few lines get another delimiter
    otherDelim: fc.option(delimiter, { nil: null }),
    eol: lineEnding,
    mixedEol: fc.boolean(),
    trailing: fc.constantFrom('', '\n', '\n\n', '\r\n', '\u0000'),
    huge: fc.oneof({ weight: 9, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.tuple(hugeCell, fc.nat(), fc.nat()) }),
  })
  .map((f) => {
    if (f.huge && f.rows.length) {
      const row = f.rows[f.huge[1] % f.rows.length];
      row[f.huge[2] % (row.length + 1)] = f.huge[0];
    }
    const lines = [...f.preamble, f.header.join(f.delim), ...f.rows.map((r, i) => r.join(f.otherDelim && i % 3 === 2 ? f.otherDelim : f.delim))];
    const text = lines.map((l, i) => l + (f.mixedEol && i % 2 ? '\r\n' : f.eol)).join('') + f.trailing;
    return (f.bom ? '\uFEFF' : '') + text;
  });

/** Good rows with one thing wrong somewhere. */
const mostlyGood = fc
  .record({
    n: fc.integer({ min: 1, max: 12 }),
    at: fc.nat(),
    bad: fc.oneof({ weight: 9, arbitrary: hostileCell }, { weight: 1, arbitrary: hugeCell }),
    col: fc.integer({ min: 0, max: 5 }),
    dupHeader: fc.boolean(),
    eol: lineEnding,
  })
  .map(({ n, at, bad, col, dupHeader, eol }) => {
    const header = ['Ref', 'X(mm)', 'Y(mm)', 'Rot', 'Side', 'Footprint', ...(dupHeader ? ['X'] : [])];
    const rows = Array.from({ length: n }, (_, i) => [`R${i + 1}`, String(i * 1.5), '2.5', '90', i % 2 ? 'bottom' : 'top', 'R0603', ...(dupHeader ? ['7'] : [])]);
    rows[at % n][col] = bad;
    return [header, ...rows].map((r) => r.join(',')).join(eol) + eol;
  });

const hostileFile = fc.oneof(
  { weight: 5, arbitrary: centroidLike },
  { weight: 3, arbitrary: mostlyGood },
  { weight: 1, arbitrary: fc.string({ maxLength: 300 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 300 }) },
);

function lineCount(text: string): number {
  return text.split(/\r\n|\r|\n/).length;
}

function checkError(e: unknown, text: string): EngineInputError {
  if (!(e instanceof EngineInputError)) throw new Error(`not the engine's input error: ${String((e as Error)?.stack ?? e)}`);
  expect(ROW_CODES.has(e.code!) || FILE_CODES.has(e.code!), `unknown error code ${e.code}: ${e.message}`).toBe(true);
  if (!NO_LINE_CODES.has(e.code!) || e.line !== undefined) {
    expect(Number.isInteger(e.line), `no line for ${e.code}: ${e.message}`).toBe(true);
    expect(e.line!).toBeGreaterThanOrEqual(1);
    expect(e.line!).toBeLessThanOrEqual(lineCount(text));
  }
  if (ROW_CODES.has(e.code!) && e.code !== 'short-row') expect(e.column, `no column for ${e.code}: ${e.message}`).toBeTruthy();
  expect(e.file).toBe('fuzz.csv');
  return e;
}

describe('hostile centroid files through the import', () => {
  test('10,000 files: only the engine input error, with its line; both imports agree', () => {
    fc.assert(
      fc.property(hostileFile, (text) => {
        let strict: ReturnType<typeof importCentroid> | null = null;
        let strictError: EngineInputError | null = null;
        try {
          strict = importCentroid(text, { file: 'fuzz.csv' });
        } catch (e) {
          strictError = checkError(e, text);
        }
        const collected = importCentroidCollecting(text, { file: 'fuzz.csv' }, 5);
        for (const e of collected.rowErrors) {
          checkError(e, text);
          expect(ROW_CODES.has(e.code!)).toBe(true);
        }
        if (collected.fileError) checkError(collected.fileError, text);
        expect(collected.rowErrors.length).toBeLessThanOrEqual(5);
        expect(collected.badRows).toBeGreaterThanOrEqual(collected.rowErrors.length);
        expect(collected.truncated).toBe(collected.badRows > collected.rowErrors.length);

        if (strict) {
          // A file the strict import takes has no bad row, and the same placements.
          expect(collected.rowErrors).toEqual([]);
          expect(collected.fileError).toBeNull();
          expect(collected.imported!.placements.length).toBe(strict.placements.length);
          const refs = new Set<string>();
          for (const p of strict.placements) {
            if (!(Number.isFinite(p.x) && Number.isFinite(p.y) && Number.isFinite(p.rotation))) throw new Error(`${p.ref}: not a finite position ${p.x}, ${p.y}, ${p.rotation}`);
            if (refs.has(p.ref)) throw new Error(`duplicate reference ${p.ref} imported`);
            refs.add(p.ref);
          }
        } else {
          // The strict import stops at the first problem in file order: the collecting one's
          // first bad row, or its file-wide error when no row was bad before it.
          const first = collected.rowErrors[0] ?? collected.fileError;
          expect(first, `strict failed (${strictError!.message}) but collecting found nothing`).toBeTruthy();
          expect([first!.line, first!.code]).toEqual([strictError!.line, strictError!.code]);
        }
      }),
      { numRuns: 10_000, seed: 19_001 },
    );
  }, 60_000);
});
