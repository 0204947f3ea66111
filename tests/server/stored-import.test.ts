// A revision's stored import is read back through its schema and stamped with the engine version;
// an import of another version (or one that does not read) is derived again from the stored file.
import { describe, expect, it } from 'vitest';
import { ENGINE_VERSION } from '../../shared/core';
import { importFile } from '../../server/modules/programs/engine';
import { readStoredImport } from '../../server/modules/programs/stored-import';
import { sampleFile } from '../helpers/programs';

const bytes = sampleFile('led-strip/led-strip.csv');
const settings = { import: {} };
const fresh = JSON.parse(JSON.stringify(importFile(bytes.toString('utf8'), settings, 'led-strip.csv')));

describe('stored imports', () => {
  it('a stored import of this engine version is used as stored', () => {
    expect(fresh.engineVersion).toBe(ENGINE_VERSION);
    const r = readStoredImport({ imported: fresh, centroidBytes: bytes, centroidName: 'led-strip.csv', settings });
    expect(r?.rederived).toBe(false);
    expect(r?.imported.placements).toHaveLength(14);
  });
  it('an import of an older engine is derived again from the file, stamped with this version', () => {
    const old = { ...fresh, engineVersion: 'older', placements: fresh.placements.slice(0, 3) };
    const r = readStoredImport({ imported: old, centroidBytes: bytes, centroidName: 'led-strip.csv', settings });
    expect(r?.rederived).toBe(true);
    expect(r?.imported.placements).toHaveLength(14);
    expect(JSON.parse(JSON.stringify(r?.imported)).engineVersion).toBe(ENGINE_VERSION);
  });
  it('a row that no longer reads (written by older code) is derived again too', () => {
    const r = readStoredImport({ imported: { placements: 'not a list' }, centroidBytes: bytes, centroidName: null, settings });
    expect(r?.rederived).toBe(true);
    expect(r?.imported.units).toBe('mil');
  });
  it('without the file, an unreadable import is a clear error and an older readable one is kept', () => {
    expect(() => readStoredImport({ imported: { placements: 1 }, centroidBytes: null, centroidName: null, settings })).toThrow(/import the centroid file again/);
    const old = { ...fresh, engineVersion: undefined };
    expect(readStoredImport({ imported: old, centroidBytes: null, centroidName: null, settings })?.rederived).toBe(false);
    expect(readStoredImport({ imported: null, centroidBytes: bytes, centroidName: null, settings })).toBeNull();
  });
});
