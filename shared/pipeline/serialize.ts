// RunResult over JSON: typed arrays become plain arrays (NaN → null) and back. Pure; used by the
// server's API and by the client to rebuild the struct of arrays the canvas draws from.
import type { PlacementColumns, RunResult } from '../core';

const F64 = ['x', 'y', 'originX', 'originY', 'rotation', 'bodyLength', 'bodyWidth', 'bodyHeight', 'courtyard', 'holderRadius', 'nozzleTip'] as const;
const I32 = ['seq', 'board', 'sourceIndex'] as const;
const U8 = ['overhang'] as const;
const TEXT = ['ref', 'side', 'packageName', 'nozzle', 'vision', 'partNumber', 'value', 'footprint'] as const;

export type PlacementColumnsJson = { count: number } & Record<(typeof F64)[number], (number | null)[]> &
  Record<(typeof I32)[number] | (typeof U8)[number], number[]> & {
    [K in (typeof TEXT)[number]]: PlacementColumns[K];
  };

/** RunResult as sent over JSON; `import.placements` is left out (the revision carries it). */
export type RunResultJson = Omit<RunResult, 'placements' | 'import'> & {
  placements: PlacementColumnsJson;
  import: Omit<RunResult['import'], 'placements'>;
};

export function runResultToJson(r: RunResult): RunResultJson {
  const p = r.placements;
  const cols = { count: p.count } as PlacementColumnsJson;
  for (const k of F64) {
    const src = p[k];
    const out: (number | null)[] = new Array(src.length);
    for (let i = 0; i < src.length; i++) out[i] = Number.isNaN(src[i]) ? null : src[i];
    cols[k] = out;
  }
  for (const k of [...I32, ...U8]) cols[k] = Array.from(p[k]);
  for (const k of TEXT) (cols as Record<string, unknown>)[k] = p[k];
  const { placements: _drop, ...importRest } = r.import;
  return { ...r, placements: cols, import: importRest };
}

export function runResultFromJson(j: RunResultJson): RunResult {
  const c = j.placements;
  const p = { count: c.count } as PlacementColumns;
  for (const k of F64) p[k] = Float64Array.from(c[k], (v) => (v === null ? NaN : v));
  for (const k of I32) p[k] = Int32Array.from(c[k]);
  for (const k of U8) p[k] = Uint8Array.from(c[k]);
  for (const k of TEXT) (p as unknown as Record<string, unknown>)[k] = c[k];
  return { ...j, placements: p, import: { ...j.import, placements: [] } };
}
