// Centroid import: dialect sniffing (sniff.ts), header mapping (headers.ts), the row loop
// (rows.ts), units and the dialect report (here). See README.md in this folder.
import Papa from 'papaparse';
import { toMm } from '../geometry';
import { EngineInputError } from '../core';
import type { BottomRotation, CentroidDialect, ColumnMapping, EngineWarning, ImportResult, Units } from '../core';
import { analyseHeader, FIELDS, REQUIRED_FIELDS, type Field } from './headers';
import { CODE_UNIT, readRows } from './rows';
import { DELIMS, fieldLabel, HEADER_SCAN_LINES, isCommentLine, mapFields, splitLine, type HeaderCandidate } from './sniff';
import { importResult } from './table';

export { tableToPlacements, placementsToTable } from './table';

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
