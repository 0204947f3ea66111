// Reading an uploaded centroid file, as a task of the worker pool (check-pool.ts → the worker's
// `preview` and `readImport`): decoding, the engine's import and the bulky derived data (the
// import's JSON text, the digest, the unmatched footprints) are all made off the main thread, so
// a large or hostile file never holds the API. Pure (no database). Errors cross the thread
// boundary as data (`TaskError`), since an Error's class does not survive structured cloning;
// the main thread turns them back into the error it answers with (`taskErrorToThrow`).
import { createHash } from 'node:crypto';
import { EngineInputError, type ImportResult } from '../../../shared/core';
import { unmatchedFootprints } from '../../../shared/library';
import type { LibraryFile } from '../../../shared/schemas/library-file.schema';
import type { Override, RevisionSettings } from '../../../shared/schemas/program.schema';
import { BadRequestError } from '../../lib/errors';
import { importFile, previewFile } from './engine';

/** The first bytes looked at for a NUL (a binary file) before decoding. */
const BINARY_PROBE_BYTES = 65536;

/** Text of an uploaded file: UTF-8 when it is valid UTF-8, else Latin-1. Refuses binary files. */
export function decodeText(bytes: Uint8Array, fileName: string): string {
  if (bytes.length === 0) throw new BadRequestError(`${fileName} is empty.`, [{ path: 'file', message: 'Empty file' }]);
  const probe = bytes.subarray(0, BINARY_PROBE_BYTES);
  if (probe.includes(0)) throw new BadRequestError(`${fileName} is not a text file (it holds binary data). Export the centroid file as CSV or text.`, [{ path: 'file', message: 'Not a text file' }]);
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder('latin1').decode(bytes);
  }
}

export function sha256(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** An error raised in the worker, as plain data. */
export type TaskError =
  | { kind: 'engine'; detail: string; file?: string; line?: number; column?: string; field?: string; code?: string }
  | { kind: 'bad-request'; message: string; errors: { path: string; message: string }[] };

export type TaskOutcome<T> = { ok: true; value: T } | { ok: false; error: TaskError };

function outcome<T>(work: () => T): TaskOutcome<T> {
  try {
    return { ok: true, value: work() };
  } catch (e) {
    if (e instanceof EngineInputError) {
      return { ok: false, error: { kind: 'engine', detail: e.detail, file: e.file, line: e.line, column: e.column, field: e.field, code: e.code } };
    }
    if (e instanceof BadRequestError) return { ok: false, error: { kind: 'bad-request', message: e.message, errors: e.errors } };
    throw e;
  }
}

/** The error a task's failure answers with on the main thread. */
export function taskErrorToThrow(e: TaskError): Error {
  if (e.kind === 'bad-request') return new BadRequestError(e.message, e.errors);
  return new EngineInputError(e.detail, { file: e.file, line: e.line, column: e.column, field: e.field, code: e.code });
}

export interface PreviewInput {
  bytes: Uint8Array;
  fileName: string;
  importOptions: RevisionSettings['import'];
  /** row errors kept in the answer (the rest are counted) */
  limit: number;
}

/** The first placements a preview shows. */
export const PREVIEW_FIRST_ROWS = 50;

export interface RowErrorDto {
  line: number;
  column: string | null;
  message: string;
}

/** What the import preview answers: the reading of the file, never saved. */
export interface ImportPreview {
  fileName: string;
  bytes: number;
  sha256: string;
  units: ImportResult['units'] | null;
  dialect: ImportResult['dialect'] | null;
  headers: string[];
  columns: ImportResult['columns'];
  warnings: ImportResult['warnings'];
  rows: number;
  first: ImportResult['placements'];
  /** bad rows in file order (at most the limit), then a file-wide problem if there was one */
  rowErrors: RowErrorDto[];
  /** more bad rows were found than are listed */
  truncated: boolean;
  /** every bad row found, listed or not */
  badRows: number;
}

/**
 * The preview of an upload: one pass of the engine's collecting import, every bad row with its
 * line (up to `limit`). A file-wide problem with no bad row before it is the answer's error.
 */
export function previewTask({ bytes, fileName, importOptions, limit }: PreviewInput): TaskOutcome<ImportPreview> {
  return outcome(() => {
    const text = decodeText(bytes, fileName);
    const { imported, rowErrors: bad, fileError, truncated, badRows } = previewFile(text, { import: importOptions }, fileName, limit);
    if (fileError && bad.length === 0) throw fileError;
    const rowErrors: RowErrorDto[] = bad.map((e) => ({ line: e.line ?? 0, column: e.column ?? null, message: e.detail }));
    if (fileError && rowErrors.length < limit) rowErrors.push({ line: fileError.line ?? 0, column: fileError.column ?? null, message: fileError.detail });
    const base = { fileName, bytes: bytes.length, sha256: sha256(bytes), rowErrors, truncated, badRows };
    if (!imported) return { ...base, units: null, dialect: null, headers: [], columns: {}, warnings: [], rows: 0, first: [] };
    return {
      ...base,
      units: imported.units,
      dialect: imported.dialect,
      headers: imported.headers,
      columns: imported.columns,
      warnings: imported.warnings,
      rows: imported.placements.length,
      first: imported.placements.slice(0, PREVIEW_FIRST_ROWS),
    };
  });
}

export interface ReadImportInput {
  bytes: Uint8Array;
  fileName: string;
  importOptions: RevisionSettings['import'];
  /** the revision's overrides: those of parts no longer in the file are dropped */
  overrides: Record<string, Override>;
  /** the shared library, for the footprints it does not match (null: none yet) */
  library: LibraryFile | null;
}

/** An import read for saving: the bulky parts already in the form they are written in. */
export interface ReadImport {
  /** the engine's import result as JSON text (written as it is into the jsonb column) */
  importedJson: string;
  rows: number;
  /** rows placed (not do-not-place) */
  placed: number;
  sha256: string;
  overrides: Record<string, Override>;
  unmatched: { footprint: string; count: number }[];
}

/** Reads an upload for saving; the first bad row stops it (EngineInputError with its line). */
export function readImportTask({ bytes, fileName, importOptions, overrides, library }: ReadImportInput): TaskOutcome<ReadImport> {
  return outcome(() => {
    const imported = importFile(decodeText(bytes, fileName), { import: importOptions }, fileName);
    const refs = new Set(imported.placements.map((p) => p.ref));
    const kept = Object.fromEntries(Object.entries(overrides).filter(([ref]) => refs.has(ref)));
    let placed = 0;
    for (const p of imported.placements) if (!p.dnp) placed++;
    return {
      importedJson: JSON.stringify(imported),
      rows: imported.placements.length,
      placed,
      sha256: sha256(bytes),
      overrides: kept,
      unmatched: library ? unmatchedFootprints(imported.placements, library, kept) : [],
    };
  });
}
