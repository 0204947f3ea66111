// Cell value parsing: numbers (decimal point or comma, optional unit suffix), sides, do-not-place.
import type { Side, Units } from '../pipeline/types';
import { unitWord } from './headers';

/** 0x.., 0b.., 0o.. are numbers to `+s` but not to a centroid file */
function isRadixLetter(c: number): boolean {
  return c === 120 || c === 88 || c === 98 || c === 66 || c === 111 || c === 79;
}

const NUM = /^\s*([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(mm|mils?|in|inch|inches|thou|")?\s*$/i;

export interface ParsedNumber {
  value: number;
  unit: Units | null;
}

/** Parse a numeric cell. Returns null when the cell is not a number. With `decimalComma` a
 * comma is the decimal separator; without it, a comma makes the cell invalid. */
export function parseNumberCell(s: string, decimalComma: boolean): ParsedNumber | null {
  // fast path: plain decimal number
  const c0 = s.charCodeAt(0);
  if ((c0 >= 48 && c0 <= 57) || c0 === 45) {
    const n = +s;
    if (n - n === 0 && !(c0 === 48 && isRadixLetter(s.charCodeAt(1)))) return { value: n, unit: null };
  }
  const m = NUM.exec(s);
  if (!m) return null;
  let num = m[1];
  if (num.indexOf(',') >= 0) {
    if (!decimalComma) return null;
    num = num.replace(',', '.');
  }
  const value = +num;
  if (!Number.isFinite(value)) return null;
  return { value, unit: m[2] ? unitWord(m[2]) : null };
}

const ROT = /^\s*([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(°|deg|degrees)?\s*$/i;

export function parseRotationCell(s: string, decimalComma: boolean): number | null {
  const c0 = s.charCodeAt(0);
  if ((c0 >= 48 && c0 <= 57) || c0 === 45) {
    const n = +s;
    if (n - n === 0 && !(c0 === 48 && isRadixLetter(s.charCodeAt(1)))) return n;
  }
  const m = ROT.exec(s);
  if (!m) return null;
  let num = m[1];
  if (num.indexOf(',') >= 0) {
    if (!decimalComma) return null;
    num = num.replace(',', '.');
  }
  const v = +num;
  return Number.isFinite(v) ? v : null;
}

const SIDES = new Map<string, Side>([
  ['top', 'top'], ['t', 'top'], ['front', 'top'], ['f', 'top'], ['component', 'top'], ['comp', 'top'],
  ['toplayer', 'top'], ['topside', 'top'], ['frontside', 'top'], ['componentside', 'top'], ['fcu', 'top'],
  ['bottom', 'bottom'], ['bot', 'bottom'], ['b', 'bottom'], ['back', 'bottom'], ['solder', 'bottom'],
  ['bottomlayer', 'bottom'], ['botlayer', 'bottom'], ['bottomside', 'bottom'], ['backside', 'bottom'],
  ['solderside', 'bottom'], ['bcu', 'bottom'],
]);

/** top/bottom, t/b, top/bot, front/back, f/b, component/solder (any case; "Top Layer" too). */
export function parseSideCell(s: string): Side | null {
  const k = s.toLowerCase().replace(/[^a-z]/g, '');
  return SIDES.get(k) ?? null;
}

const TRUE_WORDS = new Set(['yes', 'y', 'true', '1', 'x']);
const FALSE_WORDS = new Set(['no', 'n', 'false', '0', '']);

/** yes/no, true/false, 1/0, x/empty → boolean; null when unrecognised. */
export function parseFlagCell(s: string): boolean | null {
  const k = s.trim().toLowerCase().replace(/\s+/g, '');
  if (TRUE_WORDS.has(k)) return true;
  if (FALSE_WORDS.has(k)) return false;
  return null;
}
