// The import table (struct of arrays) and its record view: an ImportResult builds its records
// only when someone reads them.
import type { ImportResult, ImportTable, ImportedPlacement } from '../core';

/** The record view of an import table. */
export function tableToPlacements(t: ImportTable): ImportedPlacement[] {
  const out: ImportedPlacement[] = [];
  for (let i = 0; i < t.count; i++) {
    out.push({
      ref: t.ref[i],
      x: t.x[i],
      y: t.y[i],
      rotation: t.rotation[i],
      side: t.bottom[i] === 1 ? 'bottom' : 'top',
      footprint: t.footprint[i],
      value: t.value[i],
      partNumber: t.partNumber[i],
      dnp: t.dnp[i] === 1,
      line: t.line[i],
    });
  }
  return out;
}

/** The import table of placement records (for results made by hand or read back from JSON). */
export function placementsToTable(ps: readonly ImportedPlacement[]): ImportTable {
  const n = ps.length;
  const t: ImportTable = {
    count: n, ref: [], x: new Float64Array(n), y: new Float64Array(n), rotation: new Float64Array(n),
    bottom: new Uint8Array(n), footprint: [], value: [], partNumber: [], dnp: new Uint8Array(n), line: new Int32Array(n),
  };
  for (let i = 0; i < n; i++) {
    const p = ps[i];
    t.ref.push(p.ref); t.x[i] = p.x; t.y[i] = p.y; t.rotation[i] = p.rotation; t.bottom[i] = p.side === 'bottom' ? 1 : 0;
    t.footprint.push(p.footprint); t.value.push(p.value); t.partNumber.push(p.partNumber); t.dnp[i] = p.dnp ? 1 : 0; t.line[i] = p.line;
  }
  return t;
}

/** An ImportResult whose `placements` records are built on first read and whose `table` is
 * non-enumerable (JSON and spreads carry the records only). Reading or setting `placements`
 * drops `table` (the records may then be edited; the engine reads them instead). */
export function importResult(table: ImportTable, rest: Omit<ImportResult, 'placements' | 'table'>): ImportResult {
  const r = { ...rest } as ImportResult;
  // once the records exist they may be edited, so the table no longer speaks for them
  const settle = (v: unknown) => {
    Object.defineProperty(r, 'placements', { value: v, writable: true, enumerable: true, configurable: true });
    Object.defineProperty(r, 'table', { value: undefined, writable: true, enumerable: false, configurable: true });
  };
  Object.defineProperty(r, 'placements', {
    enumerable: true,
    configurable: true,
    get() {
      const v = tableToPlacements(table);
      settle(v);
      return v;
    },
    set(v: unknown) {
      settle(v);
    },
  });
  Object.defineProperty(r, 'table', { value: table, writable: true, enumerable: false, configurable: true });
  return r;
}
