import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { importCentroid, importCentroidCollecting } from '../../../shared/centroid';
import { EngineInputError } from '../../../shared/core';
import { hostileCentroidText as hostileFile } from '../../helpers/hostile-centroid';

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
