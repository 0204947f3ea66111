// Spreadsheet formulas in CSV cells ("CSV injection", OWASP): a cell that starts with `=`, `+`,
// `-`, `@`, a tab or a carriage return may be run as a formula when the file is opened in a
// spreadsheet (`=HYPERLINK(…)`, `=cmd|' /C calc'!A0`). Imports refuse such text cells; every CSV
// we write neutralises them the way the OWASP "CSV Injection" page recommends: prefix the cell
// with a single quote and quote the cell. Pure TypeScript: runs in the browser, server and CLI.

/** First characters that make a spreadsheet read a cell as a formula (OWASP "CSV Injection"). */
export const FORMULA_TRIGGERS: readonly string[] = ['=', '+', '-', '@', '\t', '\r'];

// A plain number, signed or not, with a decimal point or comma and an exponent: `-1.5`, `+3`,
// `-0,25`, `1e-3`. A spreadsheet reads these as numbers, not formulas, so they stay as they are.
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?$/;

const NAMES: Record<string, string> = { '=': '"="', '+': '"+"', '-': '"-"', '@': '"@"', '\t': 'a tab', '\r': 'a carriage return' };

/**
 * The leading character that would make a spreadsheet run `cell` as a formula, or null when the
 * cell is safe. `+` and `-` are safe before a plain number, and a lone `-` or `+` is plain text.
 */
export function formulaTrigger(cell: string): string | null {
  if (cell.length === 0) return null;
  const c = cell[0];
  if (!FORMULA_TRIGGERS.includes(c)) return null;
  if ((c === '-' || c === '+') && (cell.length === 1 || PLAIN_NUMBER.test(cell))) return null;
  return c;
}

export function isFormulaLike(cell: string): boolean {
  return formulaTrigger(cell) !== null;
}

/**
 * Why an imported text cell is refused, or null: e.g. `starts with "=", which a spreadsheet runs
 * as a formula; remove it (or write the text another way) and import again`.
 */
export function formulaCellProblem(cell: string): string | null {
  const t = formulaTrigger(cell);
  if (t === null) return null;
  const shown = cell.length > 40 ? cell.slice(0, 40) + '…' : cell;
  return `"${shown.replace(/[\t\r\n]/g, ' ')}" starts with ${NAMES[t]}, which a spreadsheet would run as a formula; remove ${t === '\t' || t === '\r' ? 'it' : 'that character'} (or write the text another way) and import again`;
}

/** The cell's text as a spreadsheet should show it: formula-like cells get a leading `'`. */
export function neutraliseCell(cell: string): string {
  return isFormulaLike(cell) ? "'" + cell : cell;
}

/** Undoes neutraliseCell: a leading `'` before a formula trigger is dropped. */
export function unneutraliseCell(cell: string): string {
  return cell.length > 1 && cell[0] === "'" && isFormulaLike(cell.slice(1)) ? cell.slice(1) : cell;
}

const NEEDS_QUOTE = /[",\r\n]/;

/**
 * One CSV field (RFC 4180), safe to open in a spreadsheet: a formula-like cell is prefixed with
 * `'` and quoted (OWASP); any other cell is quoted only when it holds `"`, `,`, CR or LF.
 * `delimiter` other than `,` (e.g. `;`) also forces quotes when it appears.
 */
export function csvField(cell: string, delimiter = ','): string {
  if (isFormulaLike(cell)) return '"' + ("'" + cell).replace(/"/g, '""') + '"';
  return NEEDS_QUOTE.test(cell) || (delimiter !== ',' && cell.includes(delimiter)) ? '"' + cell.replace(/"/g, '""') + '"' : cell;
}

/** One CSV line of fields (no line end); numbers are written as they are. */
export function csvRow(cells: readonly (string | number | null | undefined)[], delimiter = ','): string {
  return cells.map((c) => (c === null || c === undefined ? '' : typeof c === 'number' ? String(c) : csvField(c, delimiter))).join(delimiter);
}

/**
 * The first of a row's text cells (columns `at`, -1 for a column the file lacks) that would start
 * a formula once trimmed, with why: what an import refuses. Cheap on ordinary cells.
 */
export function firstFormulaCell(row: readonly string[], ...at: number[]): { index: number; problem: string } | null {
  for (const i of at) {
    if (i < 0) continue;
    let cell = row[i];
    if (cell === undefined || cell.length === 0) continue;
    const c0 = cell.charCodeAt(0);
    // fast path: letters, digits and most punctuation cannot start a formula (triggers: = 61,
    // + 43, - 45, @ 64, and blanks at or below 32 that a trim removes)
    if (c0 > 64 || (c0 > 45 && c0 < 61) || c0 === 62 || c0 === 63 || (c0 > 32 && c0 < 43) || c0 === 44) continue;
    // the import keeps the trimmed cell: judge that
    if (c0 <= 32 || cell.charCodeAt(cell.length - 1) <= 32) cell = cell.trim();
    const problem = formulaCellProblem(cell);
    if (problem) return { index: i, problem };
  }
  return null;
}
