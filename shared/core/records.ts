import type { PlacementColumns, PlacementRecord, Side } from './types';

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
  const out: PlacementRecord[] = [];
  for (let i = 0; i < p.count; i++) out.push(placementRecord(p, i));
  return out;
}

/** A packed array of n copies of `v` (avoids `new Array(n)`, which is slow past ~100,000 slots). */
export function filledArray<T>(n: number, v: T): T[] {
  const a: T[] = [];
  for (let i = 0; i < n; i++) a.push(v);
  return a;
}

const EMPTY_F64 = new Float64Array(0);
const EMPTY_I32 = new Int32Array(0);

/** Empty columns of length n: numeric arrays zeroed (NaN for the nullable ones), text columns ''
 * and nullable text columns null, side 'top'. With `text` false only x, y and rotation are
 * allocated; the caller defines the others as derived columns (defineLazyColumns). */
export function allocatePlacementColumns(n: number, text = true): PlacementColumns {
  // one buffer for the eleven Float64 columns and one for the three Int32 columns: few large
  // allocations instead of many (the columns are views; each has its own length n)
  const f64 = new ArrayBuffer(8 * n * (text ? 11 : 3));
  const i32 = new ArrayBuffer(text ? 4 * n * 3 : 0);
  let fi = 0;
  let ii = 0;
  const f = (): Float64Array => new Float64Array(f64, 8 * n * fi++, n);
  const int = (): Int32Array => (text ? new Int32Array(i32, 4 * n * ii++, n) : EMPTY_I32);
  const nan = (): Float64Array => (text ? f().fill(NaN) : EMPTY_F64);
  const g = (): Float64Array => (text ? f() : EMPTY_F64);
  const t = <T>(v: T): T[] => (text ? filledArray(n, v) : []);
  return {
    count: n,
    seq: int(),
    board: int(),
    ref: t(''),
    side: t<Side>('top'),
    x: f(),
    y: f(),
    originX: g(),
    originY: g(),
    rotation: f(),
    packageName: t<string | null>(null),
    nozzle: t<string | null>(null),
    vision: t<string | null>(null),
    bodyLength: nan(),
    bodyWidth: nan(),
    bodyHeight: nan(),
    courtyard: g(),
    overhang: text ? new Uint8Array(n) : new Uint8Array(0),
    holderRadius: nan(),
    nozzleTip: nan(),
    partNumber: t(''),
    value: t(''),
    footprint: t(''),
    sourceIndex: int(),
  };
}

/** Columns derived from per-part data or from the placement index (seq, board, sourceIndex) or
 * from x, y and rotation (originX/Y): everything but x, y and rotation. */
export type RepeatedColumn =
  | 'ref' | 'side' | 'partNumber' | 'value' | 'footprint' | 'packageName' | 'nozzle' | 'vision'
  | 'bodyLength' | 'bodyWidth' | 'bodyHeight' | 'courtyard' | 'overhang' | 'holderRadius' | 'nozzleTip'
  | 'seq' | 'board' | 'sourceIndex' | 'originX' | 'originY';

/**
 * Derived columns are built on first read: the getter makes the full-length array once, then
 * replaces itself with a plain data property. Reading, writing, spreading and JSON behave as for
 * a plain property. (The step-out itself computes x, y and rotation only: 100,000 placements do
 * not pay for columns nobody reads, and the result stays small.)
 */
export function defineLazyColumns(
  cols: PlacementColumns,
  builders: { [K in RepeatedColumn]?: () => PlacementColumns[K] },
): void {
  for (const key of Object.keys(builders) as RepeatedColumn[]) {
    const settle = (v: unknown) =>
      Object.defineProperty(cols, key, { value: v, writable: true, enumerable: true, configurable: true });
    Object.defineProperty(cols, key, {
      enumerable: true,
      configurable: true,
      get() {
        const v = builders[key]!();
        settle(v);
        return v;
      },
      set(v: unknown) {
        settle(v);
      },
    });
  }
}
