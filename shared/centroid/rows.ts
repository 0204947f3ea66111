// The row loop of the centroid import: each data row checked and normalised into the import
// table (numbers and units, side, do-not-place, duplicate references, spreadsheet formulas). A bad
// row is thrown, or reported and skipped when the import collects every bad row.
import { toMm } from '../geometry';
import { EngineInputError } from '../core';
import type { BottomRotation, ImportTable, Side, Units } from '../core';
import { firstFormulaCell } from '../csv-safety';
import type { HeaderInfo } from './headers';
import { parseFlagCell, parseNumberCell, parseRotationCell, parseSideCell, plainNumber } from './values';

/** trim only when needed (most cells have no surrounding blanks) */
export function trimCell(s: string): string {
  const n = s.length;
  return n > 0 && (s.charCodeAt(0) <= 32 || s.charCodeAt(n - 1) <= 32) ? s.trim() : s;
}

export const UNIT_CODE: Record<Units, number> = { mm: 1, mil: 2, in: 3 };
export const CODE_UNIT: (Units | null)[] = [null, 'mm', 'mil', 'in'];

/** normDeg without the finiteness check (the parser already refused non-finite numbers) */
function normRotation(a: number): number {
  let r = a % 360;
  if (r < 0) r += 360;
  return r >= 360 - 1e-9 || r < 1e-12 ? 0 : r;
}

const EMPTY_ROW: string[] = [];

export interface RowContext {
  file: string | undefined;
  hasQuotes: boolean;
  minCells: number;
  iRef: number;
  iX: number;
  iY: number;
  iRot: number;
  iSide: number;
  iFp: number;
  iVal: number;
  iPn: number;
  iDnp: number;
  dnpInverted: boolean;
  decimalComma: boolean;
  /** units of plain numbers when known before the rows (option or header), else null */
  knownUnit: Units | null;
  infos: HeaderInfo[];
  headerLine: number;
  bottomRotation: BottomRotation;
  /** collecting mode: a bad row is handed here and skipped; null: it is thrown */
  report: ((e: EngineInputError) => void) | null;
}

/** The row loop, on its own so that the engine optimises it as a small function. */
export function readRows(rows: string[][], c: RowContext) {
  const { hasQuotes, minCells, iRef, iX, iY, iRot, iSide, iFp, iVal, iPn, iDnp, dnpInverted, decimalComma, knownUnit, infos, headerLine } = c;
  const n = rows.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  const xu = new Uint8Array(n);
  const yu = new Uint8Array(n);
  // sized once (no growth garbage), trimmed to the row count at the end
  const refs: string[] = new Array<string>(n);
  const fps: string[] = new Array<string>(n);
  const vals: string[] = new Array<string>(n);
  const pns: string[] = new Array<string>(n);
  let count = 0;
  const X = new Float64Array(n);
  const Y = new Float64Array(n);
  const R = new Float64Array(n);
  const bottom = new Uint8Array(n);
  const dnps = new Uint8Array(n);
  const lines = new Int32Array(n);
  const refTable = new RefTable(n, refs);
  const bottomRotation = c.bottomRotation;
  let firstSuffix: { unit: Units; line: number } | null = null;
  let anyPlain = false;
  let firstPlainLine = 0;

  const report = c.report;
  /** a bad row: thrown, or (collecting) reported and then skipped by the caller's `continue` */
  const bad = (e: EngineInputError): void => {
    if (!report) throw e;
    report(e);
  };

  let line = headerLine + 1;
  for (let r = 0; r < n; r++) {
    const row = rows[r];
    // let the parsed row go as soon as it is read: the collector then copies far fewer survivors
    rows[r] = EMPTY_ROW;
    const rowLine = line;
    line++;
    if (hasQuotes) {
      for (let ci = 0; ci < row.length; ci++) {
        const cell = row[ci];
        if (cell.indexOf('\n') >= 0) line += cell.split('\n').length - 1;
      }
    }
    const first = row[0];
    if (row.length === 1 && trimCell(first) === '') continue;
    const f0 = first.charCodeAt(0);
    if ((f0 === 35 || f0 === 47 || f0 <= 32) && /^\s*(#|\/\/)/.test(first)) continue;
    if (row.length < minCells) {
      if (row.every((cell) => cell.trim() === '')) continue;
      bad(rowErr(c.file, `expected at least ${minCells} columns, found ${row.length}`, { line: rowLine, code: 'short-row' }));
      continue;
    }
    const ref = trimCell(row[iRef]);
    if (ref === '') {
      bad(rowErr(c.file, 'empty reference', { line: rowLine, column: infos[iRef].raw, code: 'empty-ref' }));
      continue;
    }
    const fx = firstFormulaCell(row, iRef, iFp, iVal, iPn); // spreadsheet formulas: shared/csv-safety
    if (fx) { bad(rowErr(c.file, fx.problem, { line: rowLine, column: infos[fx.index].raw, code: 'formula-cell' })); continue; }
    if (refTable.seen(ref, count)) {
      const prev = lines[refs.indexOf(ref)];
      bad(rowErr(c.file, `duplicate reference "${ref}" (first on line ${prev})`, {
        line: rowLine,
        column: infos[iRef].raw,
        code: 'duplicate-ref',
      }));
      continue;
    }

    let vx = plainNumber(row[iX]);
    let ux: Units | null = null;
    if (vx !== vx) {
      const p = parseNumberCell(row[iX], decimalComma);
      if (!p) {
        bad(badNumberErr(c.file, row[iX], rowLine, infos[iX].raw));
        continue;
      }
      vx = p.value;
      ux = p.unit;
    }
    let vy = plainNumber(row[iY]);
    let uy: Units | null = null;
    if (vy !== vy) {
      const p = parseNumberCell(row[iY], decimalComma);
      if (!p) {
        bad(badNumberErr(c.file, row[iY], rowLine, infos[iY].raw));
        continue;
      }
      vy = p.value;
      uy = p.unit;
    }
    const rot = parseRotationCell(row[iRot], decimalComma);
    if (rot === null) {
      bad(badNumberErr(c.file, row[iRot], rowLine, infos[iRot].raw));
      continue;
    }
    const idx = count;
    xs[idx] = vx;
    ys[idx] = vy;
    if (ux) xu[idx] = UNIT_CODE[ux];
    if (uy) yu[idx] = UNIT_CODE[uy];
    if (ux || uy) {
      if (!firstSuffix) firstSuffix = { unit: (ux ?? uy)!, line: rowLine };
    }
    if (!ux || !uy) {
      if (!anyPlain) firstPlainLine = rowLine;
      anyPlain = true;
    }

    let side: Side = 'top';
    if (iSide >= 0) {
      const s = parseSideCell(row[iSide] ?? '');
      if (!s) {
        bad(rowErr(c.file,
          `unrecognised side "${(row[iSide] ?? '').trim()}"; expected top/bottom, t/b, top/bot, front/back, f/b or component/solder`,
          { line: rowLine, column: infos[iSide].raw, code: 'bad-side' },
        ));
        continue;
      }
      side = s;
    }
    let dnp = false;
    if (iDnp >= 0) {
      const f = parseFlagCell(row[iDnp] ?? '');
      if (f === null) {
        bad(rowErr(c.file, `unrecognised do-not-place value "${(row[iDnp] ?? '').trim()}"; expected yes/no, true/false, 1/0 or x/empty`, {
          line: rowLine,
          column: infos[iDnp].raw,
          code: 'bad-flag',
        }));
        continue;
      }
      dnp = dnpInverted ? !f : f;
    }
    let rotation = rot;
    if (side === 'bottom') {
      if (bottomRotation === 'negate') rotation = -rot;
      else if (bottomRotation === 'mirror-180') rotation = 180 - rot;
    }
    refs[idx] = ref;
    const kx = ux ?? knownUnit;
    const ky = uy ?? knownUnit;
    X[idx] = kx ? toMm(vx, kx) : NaN;
    Y[idx] = ky ? toMm(vy, ky) : NaN;
    R[idx] = normRotation(rotation);
    if (side === 'bottom') bottom[idx] = 1;
    fps[idx] = iFp >= 0 ? trimCell(row[iFp] ?? '') : '';
    vals[idx] = iVal >= 0 ? trimCell(row[iVal] ?? '') : '';
    pns[idx] = iPn >= 0 ? trimCell(row[iPn] ?? '') : '';
    if (dnp) dnps[idx] = 1;
    lines[idx] = rowLine;
    count++;
  }
  refs.length = count;
  fps.length = count;
  vals.length = count;
  pns.length = count;
  const table: ImportTable = {
    count,
    ref: refs,
    x: X.subarray(0, count),
    y: Y.subarray(0, count),
    rotation: R.subarray(0, count),
    bottom: bottom.subarray(0, count),
    footprint: fps,
    value: vals,
    partNumber: pns,
    dnp: dnps.subarray(0, count),
    line: lines.subarray(0, count),
  };
  return { table, xs, ys, xu, yu, firstSuffix, anyPlain, firstPlainLine };
}

/**
 * Duplicate-reference detection: open addressing over an Int32Array keyed by a cheap string hash
 * (FNV-1a over the UTF-16 code units). Sized once for all rows, so it allocates nothing per row —
 * several times cheaper than a Set of 50,000 fresh strings.
 */
class RefTable {
  private readonly table: Int32Array;
  private readonly mask: number;
  constructor(
    rows: number,
    private readonly refs: string[],
  ) {
    let size = 16;
    while (size < rows * 2) size <<= 1;
    this.table = new Int32Array(size).fill(-1);
    this.mask = size - 1;
  }
  /**
   * true when `ref` was seen before; otherwise records it as placement `index`. A row that fails
   * after this call (collecting mode) leaves a slot naming `index`, which the next good row
   * reuses: the slot then compares against that row's reference, so it can only ever answer
   * "seen" for a reference that really was seen.
   */
  seen(ref: string, index: number): boolean {
    let h = 0x811c9dc5;
    for (let i = 0; i < ref.length; i++) h = Math.imul(h ^ ref.charCodeAt(i), 0x01000193);
    const t = this.table, mask = this.mask, refs = this.refs;
    for (let k = h & mask; ; k = (k + 1) & mask) {
      const j = t[k];
      if (j === -1) {
        t[k] = index;
        return false;
      }
      if (refs[j] === ref) return true;
    }
  }
}

function rowErr(file: string | undefined, msg: string, f: { line?: number; column?: string; field?: string; code?: string }): EngineInputError {
  return new EngineInputError(msg, { file, ...f });
}

function badNumberErr(file: string | undefined, cell: string, line: number, column: string): EngineInputError {
  return new EngineInputError(`expected a number, got "${cell.trim()}"`, { file, line, column, code: 'bad-number' });
}
