// Cell value parsing: numbers (decimal point or comma, optional unit suffix), sides, do-not-place.
import type { Side, Units } from '../core';
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

/** The unit suffix of the last `scanNumberCell` (null when none); avoids an object per cell. */
export let lastUnit: Units | null = null;

/** Parse a numeric cell: the number, or NaN when the cell is not one; its unit suffix, if any,
 * is left in `lastUnit`. With `decimalComma` a comma is the decimal separator; without it, a
 * comma makes the cell invalid. */
export function scanNumberCell(s: string, decimalComma: boolean): number {
  lastUnit = null;
  // fast path: plain decimal number
  const c0 = s.charCodeAt(0);
  if ((c0 >= 48 && c0 <= 57) || c0 === 45) {
    const n = +s;
    if (n - n === 0 && !(c0 === 48 && isRadixLetter(s.charCodeAt(1)))) return n;
  }
  const m = NUM.exec(s);
  if (!m) return NaN;
  let num = m[1];
  if (num.indexOf(',') >= 0) {
    if (!decimalComma) return NaN;
    num = num.replace(',', '.');
  }
  const value = +num;
  if (!Number.isFinite(value)) return NaN;
  lastUnit = m[2] ? unitWord(m[2]) : null;
  return value;
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * Fast path only: a plain decimal number (`-12.345`, no unit, no comma, no exponent), else NaN.
 * With at most 15 significant digits the mantissa m is an exact integer and 10^k is exact, so
 * m / 10^k is the correctly rounded value — the same double as `+s` — without the string-to-number
 * runtime call. Anything else falls back to `+s` with the same checks as before.
 */
export function plainNumber(s: string): number {
  const n = s.length;
  let i = 0;
  let neg = false;
  let c = s.charCodeAt(0);
  if (c === 45) {
    neg = true;
    i = 1;
  } else if (c === 43) i = 1;
  let m = 0;
  let digits = 0;
  let frac = -1;
  for (; i < n; i++) {
    c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      digits++;
    } else if (c === 46 && frac < 0) frac = i;
    else break;
  }
  if (i === n && digits > 0 && digits <= 15) {
    const k = frac < 0 ? 0 : n - 1 - frac;
    const v = k === 0 ? m : m / POW10[k];
    return neg ? -v : v;
  }
  // general case (exponent, leading blanks, many digits): the engine's own conversion
  const c0 = s.charCodeAt(0);
  if ((c0 >= 48 && c0 <= 57) || c0 === 45) {
    const v = +s;
    if (v - v === 0 && !(c0 === 48 && isRadixLetter(s.charCodeAt(1)))) return v;
  }
  return NaN;
}

/** Parse a numeric cell into { value, unit }, or null when the cell is not a number. */
export function parseNumberCell(s: string, decimalComma: boolean): ParsedNumber | null {
  const value = scanNumberCell(s, decimalComma);
  return Number.isNaN(value) ? null : { value, unit: lastUnit };
}

const ROT = /^\s*([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(°|deg|degrees)?\s*$/i;

export function parseRotationCell(s: string, decimalComma: boolean): number | null {
  const fast = plainNumber(s);
  if (fast === fast) return fast;
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

const sideCache = new Map<string, Side | null>();

let lastSideCell = '';
let lastSide: Side | null = null;

/** top/bottom, t/b, top/bot, front/back, f/b, component/solder (any case; "Top Layer" too). */
export function parseSideCell(s: string): Side | null {
  // most files repeat one or two spellings: compare with the last cell before hashing
  if (s === lastSideCell) return lastSide;
  let r = sideCache.get(s);
  if (r === undefined) {
    r = SIDES.get(s.toLowerCase().replace(/[^a-z]/g, '')) ?? null;
    if (sideCache.size < 1000) sideCache.set(s, r);
  }
  lastSideCell = s;
  lastSide = r;
  return r;
}

const TRUE_WORDS = new Set(['yes', 'y', 'true', '1', 'x']);
const FALSE_WORDS = new Set(['no', 'n', 'false', '0', '']);

const flagCache = new Map<string, boolean | null>();

/** yes/no, true/false, 1/0, x/empty → boolean; null when unrecognised. */
export function parseFlagCell(s: string): boolean | null {
  let r = flagCache.get(s);
  if (r === undefined) {
    const k = s.trim().toLowerCase().replace(/\s+/g, '');
    r = TRUE_WORDS.has(k) ? true : FALSE_WORDS.has(k) ? false : null;
    if (flagCache.size < 1000) flagCache.set(s, r);
  }
  return r;
}
