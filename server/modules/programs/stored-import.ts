// A revision's stored import, read back through its schema (not a cast). An import made by
// another engine version, or one that no longer reads, is derived again from the stored file
// bytes with the revision's import options; the caller may store the fresh one. Pure (no database).
import { ENGINE_VERSION, type ImportResult } from '../../../shared/core';
import { storedImportSchema } from '../../../shared/schemas/stored-import.schema';
import type { RevisionSettings } from '../../../shared/schemas/program.schema';
import { BadRequestError } from '../../lib/errors';
import { CENTROID_NAME_FALLBACK, importFile } from './engine';
import { decodeText } from './import-task';

export interface StoredImportRow {
  imported: unknown;
  centroidBytes: Uint8Array | null;
  centroidName: string | null;
  settings: Pick<RevisionSettings, 'import'>;
}

/** The stored import, fresh: `rederived` says it was read again from the file (store it). */
export function readStoredImport(row: StoredImportRow): { imported: ImportResult; rederived: boolean } | null {
  if (row.imported === null || row.imported === undefined) return null;
  const parsed = storedImportSchema.safeParse(row.imported);
  if (parsed.success && parsed.data.engineVersion === ENGINE_VERSION) return { imported: parsed.data, rederived: false };
  if (row.centroidBytes && row.centroidBytes.length > 0) {
    const name = row.centroidName ?? CENTROID_NAME_FALLBACK;
    const imported = importFile(decodeText(row.centroidBytes, name), row.settings, name);
    // materialise the records: the stored form is JSON (records, no table)
    return { imported: { ...imported, placements: imported.placements }, rederived: true };
  }
  if (parsed.success) return { imported: parsed.data, rederived: false };
  throw new BadRequestError('The stored import of this revision cannot be read and its file is missing: import the centroid file again.', [{ path: 'imported', message: 'Unreadable' }]);
}
