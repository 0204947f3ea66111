// Centroid import: dialect sniffing, header mapping, units, normalisation (CLI.md "Import").
import Papa from 'papaparse';
import { toMm } from '../geometry';
import { EngineInputError } from '../core';
import type {
  BottomRotation,
  CentroidDialect,
  ColumnMapping,
  EngineWarning,
  ImportResult,
  ImportTable,
  ImportedPlacement,
  Side,
  Units,
} from '../core';
import { firstFormulaCell } from '../csv-safety';
import { analyseHeader, FIELDS, REQUIRED_FIELDS, type Field, type HeaderInfo } from './headers';
import { parseFlagCell, parseNumberCell, parseRotationCell, parseSideCell, plainNumber } from './values';

/** trim only when needed (most cells have no surrounding blanks) */
function trimCell(s: string): string {
  const n = s.length;
  return n > 0 && (s.charCodeAt(0) <= 32 || s.charCodeAt(n - 1) <= 32) ? s.trim() : s;
}

export interface ImportOptions {
  /** units given by the user; overrides the header */
  units?: Units;
  /** where `units` came from (for the dialect report) */
  unitsSource?: 'option' | 'job';
  bottomRotation?: BottomRotation;
  /** field → header cell as written (case-insensitive) */
  map?: Partial<Record<Field, string>>;
  /** file name for error messages */
  file?: string;
}

/** What `importCentroidCollecting` found: the good rows, and every bad row (up to the cap). */
export interface CollectedImport {
  /** the import of the good rows; null when a file-wide problem stopped the reading */
  imported: ImportResult | null;
  /** bad rows in file order, at most `limit` of them */
  rowErrors: EngineInputError[];
  /** a problem with the whole file (no header, no units, no rows…), else null */
  fileError: EngineInputError | null;
  /** more bad rows than `limit` were found (they are counted, not kept) */
  truncated: boolean;
  /** every bad row found, kept or not */
  badRows: number;
}

const DELIMS = [',', ';', '\t'] as const;
type Delim = (typeof DELIMS)[number];
const HEADER_SCAN_LINES = 200;
const UNIT_CODE: Record<Units, number> = { mm: 1, mil: 2, in: 3 };
const CODE_UNIT: (Units | null)[] = [null, 'mm', 'mil', 'in'];

/** Split one line on a delimiter, honouring double quotes (for header sniffing only). */
function splitLine(line: string, delim: string): string[] {
  if (line.indexOf('"') < 0) return line.split(delim);
  const out: string[] = [];
  let cur = '';
  let q = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (q) {
      if (ch === '"') {
        if (line[i + 1] === '"') {
          cur += '"';
          i++;
        } else q = false;
      } else cur += ch;
    } else if (ch === '"') q = true;
    else if (ch === delim) {
      out.push(cur);
      cur = '';
    } else cur += ch;
  }
  out.push(cur);
  return out;
}

interface HeaderCandidate {
  line: number;
  /** offset in text just after this line's end */
  next: number;
  delim: Delim;
  infos: HeaderInfo[];
  fields: Map<Field, number>;
}

function isCommentLine(t: string): boolean {
  return t.startsWith('#') || t.startsWith('//') || t.startsWith(';') && t.length > 1 && !t.slice(1).includes(';');
}

function mapFields(infos: HeaderInfo[], map: Partial<Record<Field, string>>): Map<Field, number> {
  const fields = new Map<Field, number>();
  const taken = new Set<number>();
  for (const f of FIELDS) {
    const want = map[f];
    if (want === undefined) continue;
    const w = want.trim().toLowerCase();
    const idx = infos.findIndex((h) => h.raw.toLowerCase() === w);
    if (idx >= 0) {
      fields.set(f, idx);
      taken.add(idx);
    }
  }
  infos.forEach((h, i) => {
    if (h.field && !fields.has(h.field) && !taken.has(i) && map[h.field] === undefined) fields.set(h.field, i);
  });
  return fields;
}

/**
 * Import a centroid file. Throws EngineInputError (file, line, column) on bad input; the first
 * bad row (in file order) stops it.
 */
export function importCentroid(input: string, opts: ImportOptions = {}): ImportResult {
  return readCentroid(input, opts, null);
}

/**
 * Import a centroid file in one pass, collecting every bad row instead of stopping at the first:
 * a bad row is left out and reported with its line and column, the good rows are imported. A
 * problem with the whole file (no header row, no units, no rows left) ends the reading and is
 * returned as `fileError`. At most `limit` row errors are kept; the rest are only counted.
 */
export function importCentroidCollecting(input: string, opts: ImportOptions = {}, limit = 200): CollectedImport {
  const rowErrors: EngineInputError[] = [];
  let badRows = 0;
  const report = (e: EngineInputError) => {
    badRows++;
    if (rowErrors.length < limit) rowErrors.push(e);
  };
  try {
    const imported = readCentroid(input, opts, report);
    return { imported, rowErrors, fileError: null, truncated: badRows > rowErrors.length, badRows };
  } catch (e) {
    if (!(e instanceof EngineInputError)) throw e;
    return { imported: null, rowErrors, fileError: e, truncated: badRows > rowErrors.length, badRows };
  }
}

function readCentroid(input: string, opts: ImportOptions, report: ((e: EngineInputError) => void) | null): ImportResult {
  const file = opts.file;
  const map = opts.map ?? {};
  const warnings: EngineWarning[] = [];
  const err = (msg: string, f: { line?: number; column?: string; field?: string; code?: string } = {}) =>
    new EngineInputError(msg, { file, ...f });

  for (const k of Object.keys(map)) {
    if (!(FIELDS as readonly string[]).includes(k)) {
      throw err(`unknown field "${k}" in the column map; expected one of ${FIELDS.join(', ')}`, {
        field: `map.${k}`,
        code: 'bad-map',
      });
    }
  }

  let text = input;
  const bom = text.charCodeAt(0) === 0xfeff;
  if (bom) text = text.slice(1);
  let lineEnding: CentroidDialect['lineEnding'] = '\n';
  if (text.indexOf('\r\n') >= 0) lineEnding = '\r\n';
  else if (text.indexOf('\r') >= 0) {
    lineEnding = '\r';
    text = text.replace(/\r/g, '\n');
  }

  // ---- header sniffing ----------------------------------------------------------------------
  let header: HeaderCandidate | null = null;
  let nearMiss: HeaderCandidate | null = null;
  let nearMissScore = 0;
  let pos = 0;
  let lineNo = 0;
  let sawContent = false;
  while (pos <= text.length && lineNo < HEADER_SCAN_LINES) {
    let end = text.indexOf('\n', pos);
    if (end < 0) end = text.length;
    lineNo++;
    let line = text.slice(pos, end);
    if (line.endsWith('\r')) line = line.slice(0, -1);
    const next = end + 1;
    const t = line.trim();
    if (t !== '' && !isCommentLine(t)) {
      sawContent = true;
      let best: HeaderCandidate | null = null;
      let bestScore = -1;
      for (const delim of DELIMS) {
        const cells = splitLine(line, delim);
        if (cells.length < 2) continue;
        const infos = cells.map(analyseHeader);
        const fields = mapFields(infos, map);
        const score = fields.size;
        if (score > bestScore) {
          bestScore = score;
          best = { line: lineNo, next, delim, infos, fields };
        }
      }
      if (best && best.fields.has('ref') && best.fields.has('x') && best.fields.has('y')) {
        header = best;
        break;
      }
      if (best && bestScore >= 3 && bestScore > nearMissScore) {
        nearMiss = best;
        nearMissScore = bestScore;
      }
    }
    if (end >= text.length) break;
    pos = next;
  }
  if (!header) {
    if (!sawContent) throw err('the file is empty: no header and no data rows', { code: 'empty' });
    if (nearMiss) {
      const missing = (['ref', 'x', 'y'] as Field[]).filter((f) => !nearMiss!.fields.has(f));
      throw err(
        `missing required column ${missing.map(fieldLabel).join(', ')} in the header row; ` +
          `found ${nearMiss.infos.map((h) => `"${h.raw}"`).join(', ')} (map one with --map FIELD=HEADER)`,
        { line: nearMiss.line, field: missing[0], code: 'missing-column' },
      );
    }
    throw err('no header row found: expected columns for reference, X and Y (e.g. "Ref,X,Y,Rot")', {
      code: 'no-header',
    });
  }
  const { delim, infos, fields } = header;
  const headerLine = header.line;
  for (const f of FIELDS) {
    const want = map[f];
    if (want !== undefined && !fields.has(f)) {
      throw err(`--map ${f}=${want}: no column "${want}" in the header (${infos.map((h) => `"${h.raw}"`).join(', ')})`, {
        line: headerLine,
        field: `map.${f}`,
        code: 'bad-map',
      });
    }
  }
  for (const f of REQUIRED_FIELDS) {
    if (!fields.has(f)) {
      throw err(`missing required column ${fieldLabel(f)} in the header row (map one with --map ${f}=HEADER)`, {
        line: headerLine,
        field: f,
        code: 'missing-column',
      });
    }
  }
  infos.forEach((h, i) => {
    if (h.field && fields.get(h.field) !== i && map[h.field] === undefined) {
      warnings.push({
        line: headerLine,
        message: `column "${h.raw}" also reads as ${h.field}; using "${infos[fields.get(h.field)!].raw}"`,
        code: 'duplicate-column',
      });
    }
  });
  const columns: ColumnMapping = {};
  for (const [f, i] of fields) columns[f] = infos[i].raw;

  // ---- data rows ----------------------------------------------------------------------------
  const body = header.next <= text.length ? text.slice(header.next) : '';
  const parsed = Papa.parse<string[]>(body, {
    delimiter: delim,
    newline: lineEnding === '\r\n' ? '\r\n' : '\n',
    skipEmptyLines: false,
    header: false,
  });
  const rows = parsed.data;
  const hasQuotes = body.indexOf('"') >= 0;

  const iRef = fields.get('ref')!;
  const iX = fields.get('x')!;
  const iY = fields.get('y')!;
  const iRot = fields.get('rotation')!;
  const iSide = fields.get('side') ?? -1;
  const iFp = fields.get('footprint') ?? -1;
  const iVal = fields.get('value') ?? -1;
  const iPn = fields.get('partNumber') ?? -1;
  const iDnp = fields.get('dnp') ?? -1;
  const dnpInverted = iDnp >= 0 && infos[iDnp].invertedDnp;
  const minCells = Math.max(iRef, iX, iY, iRot) + 1;

  // decimal comma: a numeric cell with a comma in the first rows
  let decimalComma = false;
  for (let r = 0, seen = 0; r < rows.length && seen < 50; r++) {
    const row = rows[r];
    if (row.length < minCells) continue;
    seen++;
    if (/^\s*[-+]?\d*,\d+/.test(row[iX]) || /^\s*[-+]?\d*,\d+/.test(row[iY])) {
      decimalComma = true;
      break;
    }
  }

  const hx = infos[iX].unit;
  const hy = infos[iY].unit;
  if (hx && hy && hx !== hy) {
    throw err(`the X column is in ${hx} but the Y column in ${hy}`, { line: headerLine, column: infos[iY].raw, code: 'unit-conflict' });
  }
  const headerUnit = hx ?? hy;
  // the factor for plain numbers when the units are known before reading the rows (else NaN:
  // fixed after the rows, once a unit suffix on the values has told them)
  const knownUnit: Units | null = opts.units ?? headerUnit ?? null;

  const { table, xs, ys, xu, yu, firstSuffix, anyPlain, firstPlainLine } = readRows(rows, {
    file, hasQuotes, minCells, iRef, iX, iY, iRot, iSide, iFp, iVal, iPn, iDnp, dnpInverted, decimalComma, knownUnit, infos,
    headerLine, bottomRotation: opts.bottomRotation ?? 'bottom-view', report,
  });
  if (table.count === 0) {
    throw err('the file is empty: a header row but no data rows', { line: headerLine, code: 'empty' });
  }

  // ---- units ----------------------------------------------------------------------------------
  let units: Units;
  let unitsSource: CentroidDialect['unitsSource'];
  if (opts.units) {
    units = opts.units;
    unitsSource = opts.unitsSource ?? 'option';
    if (headerUnit && headerUnit !== opts.units) {
      warnings.push({
        line: headerLine,
        message: `units ${opts.units} given ${unitsSource === 'job' ? 'in the job' : 'by --units'} override the header's ${headerUnit}`,
        code: 'units-override',
      });
    }
  } else if (headerUnit) {
    units = headerUnit;
    unitsSource = 'header';
    warnings.push({
      line: headerLine,
      message: `units ${units} taken from the header "${infos[hx ? iX : iY].raw}"`,
      code: 'units-inferred',
    });
  } else if (firstSuffix) {
    units = firstSuffix.unit;
    unitsSource = 'values';
    warnings.push({
      line: firstSuffix.line,
      message: `units ${units} taken from the unit suffix on the values`,
      code: 'units-inferred',
    });
    if (anyPlain) {
      throw err(`a coordinate without a unit while other values carry one; give --units mm|mil|in`, {
        line: firstPlainLine,
        column: infos[iX].raw,
        code: 'no-units',
      });
    }
  } else {
    throw err('the units cannot be told: no unit in the header (e.g. "X(mm)") or on the values; give --units mm|mil|in', {
      line: headerLine,
      column: infos[iX].raw,
      code: 'no-units',
    });
  }
  let mixed = false;
  if (knownUnit !== units) {
    for (let i = 0; i < table.count; i++) {
      if (!xu[i]) table.x[i] = toMm(xs[i], units);
      if (!yu[i]) table.y[i] = toMm(ys[i], units);
    }
  }
  if (firstSuffix) {
    for (let i = 0; i < table.count; i++) {
      if ((xu[i] && CODE_UNIT[xu[i]] !== units) || (yu[i] && CODE_UNIT[yu[i]] !== units)) mixed = true;
    }
  }
  if (mixed) warnings.push({ line: null, message: `some values carry a unit other than ${units}; each was converted by its own unit`, code: 'units-mixed' });
  if (iSide < 0) warnings.push({ line: null, message: 'no side column: every part is on the top side', code: 'no-side' });
  if (iFp < 0) warnings.push({ line: null, message: 'no footprint column: no part can match a library package', code: 'no-footprint' });

  const dialect: CentroidDialect = {
    delimiter: delim,
    decimalComma,
    headerLine,
    bom,
    lineEnding,
    unitsSource,
    dnpSense: iDnp < 0 ? null : dnpInverted ? 'fitted' : 'dnp',
  };
  return importResult(table, { columns, units, dialect, headers: infos.map((h) => h.raw), warnings });

}


/** normDeg without the finiteness check (the parser already refused non-finite numbers) */
function normRotation(a: number): number {
  let r = a % 360;
  if (r < 0) r += 360;
  return r >= 360 - 1e-9 || r < 1e-12 ? 0 : r;
}

function fieldLabel(f: Field): string {
  return f === 'ref' ? 'reference' : f === 'x' ? 'X' : f === 'y' ? 'Y' : f;
}


const EMPTY_ROW: string[] = [];

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
function importResult(table: ImportTable, rest: Omit<ImportResult, 'placements' | 'table'>): ImportResult {
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

interface RowContext {
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
function readRows(rows: string[][], c: RowContext) {
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
