// The Import page's words for a file it cannot read: the units point
// at the Units control (no command-line flag), an empty file is called empty, sizes use kB = 1000 B.
import { describe, expect, it } from 'vitest';
import { describeImportProblem, isUnitsMessage, withoutFlags } from '../../src/app/routes/programs/stages/import-problems';
import { ApiError } from '../../src/lib/api-client';
import { fileSize } from '../../src/lib/format';
import { fileSize as runFilesSize } from '../../src/features/run-files/lib/format';

const problem = (status: number, title: string, detail: string, errors: { path: string; message: string }[] = []) => new ApiError({ status, title, detail, errors });

describe('import problems on the web', () => {
  it('no units: points at the Units control, without the CLI flag or a list of locations', () => {
    // the engine's answer as the server sends it (file, line, column as the path)
    const e = problem(400, 'Invalid input', 'board.csv, line 1, column "PosX": the units cannot be told: no unit in the header (e.g. "X(mm)") or on the values; give --units mm|mil|in', [
      { path: 'board.csv, line 1, column "PosX"', message: 'the units cannot be told: no unit in the header (e.g. "X(mm)") or on the values; give --units mm|mil|in' },
    ]);
    const d = describeImportProblem(e, 'board.csv');
    expect(d.needsUnits).toBe(true);
    expect(d.title).toBe('Choose the units');
    expect(d.message).toMatch(/Units, on the left/);
    expect(d.message).not.toMatch(/--units|line 0|no header row/);
    expect(d.details).toEqual([]);
  });

  it('mixed units: the same control, with the line of the first bare number', () => {
    const e = problem(400, 'Invalid input', 'b.csv, line 7, column "X": a coordinate without a unit while other values carry one; give --units mm|mil|in', [
      { path: 'b.csv, line 7, column "X"', message: 'a coordinate without a unit while other values carry one; give --units mm|mil|in' },
    ]);
    const d = describeImportProblem(e);
    expect(d.needsUnits).toBe(true);
    expect(d.details).toEqual([{ path: 'b.csv, line 7, column "X"', message: 'the first bare number' }]);
    expect(JSON.stringify(d)).not.toMatch(/--units/);
  });

  it('an empty file is titled as such, not "Bad request"', () => {
    const d = describeImportProblem(problem(400, 'Bad request', 'empty.csv is empty.', [{ path: 'file', message: 'Empty file' }]), 'empty.csv');
    expect(d.title).toBe('The file is empty');
    expect(d.message).toMatch(/^empty\.csv holds no header and no rows/);
  });

  it('other engine errors keep their words, lose the CLI flags, and are not listed twice', () => {
    const d = describeImportProblem(problem(400, 'Invalid input', 'x.csv, line 2: missing required column X in the header row; found "A", "B" (map one with --map FIELD=HEADER)', [
      { path: 'x.csv, line 2', message: 'missing required column X in the header row; found "A", "B" (map one with --map FIELD=HEADER)' },
    ]));
    expect(d.title).toBe('The file cannot be imported');
    expect(d.message).toBe('x.csv, line 2: missing required column X in the header row; found "A", "B"');
    expect(d.details).toEqual([]);
  });

  it('recognises the units messages and strips flags', () => {
    expect(isUnitsMessage('the units cannot be told: no unit in the header')).toBe(true);
    expect(isUnitsMessage('bad number "1,2,3"')).toBe(false);
    expect(withoutFlags('the units cannot be told; give --units mm|mil|in')).toBe('the units cannot be told');
  });
});

describe('file sizes: one formatter, kB = 1000 bytes (SI prefixes)', () => {
  it.each([
    [812, '812 B'],
    [41_200, '41.2 kB'],
    [999_949, '999.9 kB'],
    [999_950, '1.0 MB'],
    [1_300_000, '1.3 MB'],
  ])('%d bytes → %s', (b, text) => {
    expect(fileSize(b)).toBe(text);
    expect(runFilesSize(b)).toBe(text);
  });
});
