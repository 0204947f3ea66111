// The order of a report: each raw record's public kind and severity, and the sort keys
// (errors first, then kind, then board and reference in natural order) computed on the compact
// records before any finding object exists.
import { FINDING_KINDS, type FindingKind } from '../schemas/finding.schema';
import { sortRefsNatural } from './natural';
import {
  FindingSink,
  K_BODY,
  K_BOARD_OVERLAP,
  K_COURTYARD,
  K_FIDUCIAL,
  K_NO_NOZZLE,
  K_NO_PACKAGE,
  K_NOZZLE_SIZE,
  K_OFF_BOARD,
  K_OFF_PANEL,
  K_OVERHANG,
  K_PANEL_REACH,
  K_REACH,
  K_SHADOW,
} from './sink';
import type { VerifyInput } from './types';

/** Public kind and severity of each raw record kind. */
export const RAW: { kind: FindingKind; severity: 'error' | 'warning' }[] = [];
RAW[K_BODY] = { kind: 'body-overlap', severity: 'error' };
RAW[K_COURTYARD] = { kind: 'courtyard-overlap', severity: 'warning' };
RAW[K_OFF_BOARD] = { kind: 'off-board', severity: 'error' };
RAW[K_OVERHANG] = { kind: 'off-board', severity: 'warning' };
RAW[K_BOARD_OVERLAP] = { kind: 'board-overlap', severity: 'error' };
RAW[K_OFF_PANEL] = { kind: 'off-panel', severity: 'error' };
RAW[K_FIDUCIAL] = { kind: 'fiducial-clearance', severity: 'error' };
RAW[K_SHADOW] = { kind: 'nozzle-shadow', severity: 'warning' };
RAW[K_REACH] = { kind: 'out-of-reach', severity: 'error' };
RAW[K_PANEL_REACH] = { kind: 'out-of-reach', severity: 'error' };
RAW[K_NO_PACKAGE] = { kind: 'no-package', severity: 'error' };
RAW[K_NO_NOZZLE] = { kind: 'no-nozzle', severity: 'error' };
RAW[K_NOZZLE_SIZE] = { kind: 'nozzle-size', severity: 'warning' };

const KIND_RANK = new Map<FindingKind, number>(FINDING_KINDS.map((k, i) => [k, i]));
/** First sort key of each raw kind: errors first, then the kinds in FINDING_KINDS order. */
export const KIND_KEY = RAW.map((r) => (r.severity === 'error' ? 0 : 100) + KIND_RANK.get(r.kind)!);

/** Five numbers per record: severity and kind rank, then (board, natural reference rank) of the
 * first and second subject in "BOARD:REF" order (-1 where there is none). */
export function sortKeys(input: VerifyInput, sink: FindingSink, swap: Uint8Array): Float64Array {
  const n = sink.size;
  const { board, ref } = input;
  // natural rank of the references that occur in findings: an id per distinct reference (one
  // map lookup per placement, not per record), then the ids' ranks
  const idOf = new Int32Array(input.count).fill(-1);
  const idByName = new Map<string, number>();
  const names: string[] = [];
  const nameId = (i: number): number => {
    let id = idOf[i];
    if (id < 0) {
      const name = ref[i];
      const known = idByName.get(name);
      if (known === undefined) {
        id = names.length;
        idByName.set(name, id);
        names.push(name);
      } else {
        id = known;
      }
      idOf[i] = id;
    }
    return id;
  };
  for (let k = 0; k < n; k++) {
    const raw = sink.kind[k];
    if (isBoardKind(raw)) continue;
    nameId(sink.a[k]);
    if (isPairKind(raw)) nameId(sink.b[k]);
  }
  const sorted = sortRefsNatural(names);
  const rankOfId = new Int32Array(names.length);
  for (let r = 0; r < sorted.length; r++) rankOfId[idByName.get(sorted[r])!] = r;
  const keys = new Float64Array(5 * n);
  for (let k = 0; k < n; k++) {
    const raw = sink.kind[k];
    const o = 5 * k;
    keys[o] = KIND_KEY[raw];
    keys[o + 2] = -1;
    keys[o + 3] = -1;
    keys[o + 4] = -1;
    if (raw === K_PANEL_REACH) {
      keys[o + 1] = 0;
    } else if (raw === K_BOARD_OVERLAP || raw === K_OFF_PANEL) {
      const b1 = input.boards[sink.a[k]].board;
      const b2 = raw === K_BOARD_OVERLAP ? input.boards[sink.b[k]].board : -1;
      keys[o + 1] = b2 >= 0 && b2 < b1 ? b2 : b1;
      keys[o + 3] = b2 >= 0 && b2 < b1 ? b1 : b2;
    } else {
      const i = sink.a[k];
      let b1 = board[i];
      let r1 = rankOfId[idOf[i]];
      if (isPairKind(raw)) {
        const j = sink.b[k];
        let b2 = board[j];
        let r2 = rankOfId[idOf[j]];
        if (b2 < b1 || (b2 === b1 && r2 < r1)) {
          swap[k] = 1;
          const tb = b1;
          b1 = b2;
          b2 = tb;
          const tr = r1;
          r1 = r2;
          r2 = tr;
        }
        keys[o + 3] = b2;
        keys[o + 4] = r2;
      }
      keys[o + 1] = b1;
      keys[o + 2] = r1;
    }
  }
  return keys;
}

/** Record indices in report order (keys: five numbers per record; ties by index). */
export function sortOrder(keys: Float64Array, n: number): ArrayLike<number> {
  // one number per record (rank, subjects and the record index in mixed radix) when the product
  // of the ranges stays exact (below 2^53; it does for any real panel): a native numeric sort
  const packed = packKeys(keys, n);
  if (packed) {
    packed.sort();
    const order = new Int32Array(n);
    for (let t = 0; t < n; t++) {
      const v = packed[t];
      order[t] = v - Math.floor(v / n) * n;
    }
    return order;
  }
  const order = new Array<number>(n);
  for (let k = 0; k < n; k++) order[k] = k;
  order.sort((x, y) => {
    for (let f = 0; f < 5; f++) {
      const d = keys[5 * x + f] - keys[5 * y + f];
      if (d !== 0) return d;
    }
    return x - y;
  });
  return order;
}

/** Each record's five keys and its index as one exact number, or null when they do not fit. */
function packKeys(keys: Float64Array, n: number): Float64Array | null {
  // ranges: the first key (severity and kind, < 200), boards and ranks (≥ -1)
  let maxB = -1;
  let maxR = -1;
  let maxK = 0;
  for (let k = 0; k < n; k++) {
    const o = 5 * k;
    if (keys[o] > maxK) maxK = keys[o];
    if (keys[o + 1] > maxB) maxB = keys[o + 1];
    if (keys[o + 3] > maxB) maxB = keys[o + 3];
    if (keys[o + 2] > maxR) maxR = keys[o + 2];
    if (keys[o + 4] > maxR) maxR = keys[o + 4];
  }
  const NB = maxB + 2;
  const NR = maxR + 2;
  const S = NB * NR;
  if ((maxK + 1) * S * S * n >= 2 ** 53) return null;
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const o = 5 * k;
    const s1 = (keys[o + 1] + 1) * NR + keys[o + 2] + 1;
    const s2 = (keys[o + 3] + 1) * NR + keys[o + 4] + 1;
    out[k] = ((keys[o] * S + s1) * S + s2) * n + k;
  }
  return out;
}

export function isPairKind(raw: number): boolean {
  return raw === K_BODY || raw === K_COURTYARD || raw === K_SHADOW;
}

export function isBoardKind(raw: number): boolean {
  return raw === K_BOARD_OVERLAP || raw === K_OFF_PANEL || raw === K_PANEL_REACH;
}
