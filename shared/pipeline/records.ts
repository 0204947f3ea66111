import type { PlacementColumns, PlacementRecord } from './types';

const nn = (v: number): number | null => (Number.isNaN(v) ? null : v);

/** Record view of placement `i` (NaN in the typed arrays becomes null). */
export function placementRecord(p: PlacementColumns, i: number): PlacementRecord {
  if (!Number.isInteger(i) || i < 0 || i >= p.count) {
    throw new RangeError(`placement index ${i} out of range: ${p.count} placements`);
  }
  return {
    seq: p.seq[i],
    board: p.board[i],
    ref: p.ref[i],
    side: p.side[i],
    x: p.x[i],
    y: p.y[i],
    originX: p.originX[i],
    originY: p.originY[i],
    rotation: p.rotation[i],
    packageName: p.packageName[i],
    nozzle: p.nozzle[i],
    vision: p.vision[i],
    bodyLength: nn(p.bodyLength[i]),
    bodyWidth: nn(p.bodyWidth[i]),
    bodyHeight: nn(p.bodyHeight[i]),
    courtyard: p.courtyard[i],
    overhang: p.overhang[i] === 1,
    holderRadius: nn(p.holderRadius[i]),
    partNumber: p.partNumber[i],
    value: p.value[i],
    footprint: p.footprint[i],
    sourceIndex: p.sourceIndex[i],
  };
}

/** All placements as records (convenient for small lists and tests; allocates). */
export function placementRecords(p: PlacementColumns): PlacementRecord[] {
  const out: PlacementRecord[] = new Array(p.count);
  for (let i = 0; i < p.count; i++) out[i] = placementRecord(p, i);
  return out;
}

/** Empty columns of length n, numeric arrays zeroed (NaN for the nullable ones). */
export function allocatePlacementColumns(n: number): PlacementColumns {
  const nan = (): Float64Array => new Float64Array(n).fill(NaN);
  return {
    count: n,
    seq: new Int32Array(n),
    board: new Int32Array(n),
    ref: new Array(n),
    side: new Array(n),
    x: new Float64Array(n),
    y: new Float64Array(n),
    originX: new Float64Array(n),
    originY: new Float64Array(n),
    rotation: new Float64Array(n),
    packageName: new Array(n),
    nozzle: new Array(n),
    vision: new Array(n),
    bodyLength: nan(),
    bodyWidth: nan(),
    bodyHeight: nan(),
    courtyard: new Float64Array(n),
    overhang: new Uint8Array(n),
    holderRadius: nan(),
    partNumber: new Array(n),
    value: new Array(n),
    footprint: new Array(n),
    sourceIndex: new Int32Array(n),
  };
}
