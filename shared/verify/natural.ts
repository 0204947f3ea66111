// Natural order of reference designators (R2 before R10, C1 before C1A before C2) and of the
// "BOARD:REF" strings of findings (board number first).

/** Compare two references in natural order: runs of digits compare by value, other runs by
 * their characters (case-insensitive first, then exact, so the order is total). */
export function compareRefs(a: string, b: string): number {
  let i = 0;
  let j = 0;
  const na = a.length;
  const nb = b.length;
  while (i < na && j < nb) {
    const ca = a.charCodeAt(i);
    const cb = b.charCodeAt(j);
    const da = ca >= 48 && ca <= 57;
    const db = cb >= 48 && cb <= 57;
    if (da && db) {
      let ie = i;
      while (ie < na && isDigit(a.charCodeAt(ie))) ie++;
      let je = j;
      while (je < nb && isDigit(b.charCodeAt(je))) je++;
      // compare numerically without overflow: strip leading zeros, then length, then digits
      let is = i;
      while (is < ie - 1 && a.charCodeAt(is) === 48) is++;
      let js = j;
      while (js < je - 1 && b.charCodeAt(js) === 48) js++;
      const la = ie - is;
      const lb = je - js;
      if (la !== lb) return la - lb;
      for (let k = 0; k < la; k++) {
        const d = a.charCodeAt(is + k) - b.charCodeAt(js + k);
        if (d !== 0) return d;
      }
      // equal values: fewer leading zeros first
      if (ie - i !== je - j) return ie - i - (je - j);
      i = ie;
      j = je;
    } else if (da !== db) {
      // a digit run sorts before letters (C1 before CA)
      return da ? -1 : 1;
    } else {
      const la = lower(ca);
      const lb = lower(cb);
      if (la !== lb) return la - lb;
      i++;
      j++;
    }
  }
  if (na - i !== nb - j) return na - i - (nb - j);
  return a < b ? -1 : a > b ? 1 : 0;
}

function isDigit(c: number): boolean {
  return c >= 48 && c <= 57;
}

function lower(c: number): number {
  return c >= 65 && c <= 90 ? c + 32 : c;
}

/** "BOARD:REF" of a placement. */
export function boardRef(board: number, ref: string): string {
  return `${board}:${ref}`;
}

/** Compare (board, ref) pairs: board number, then reference in natural order. */
export function compareBoardRefs(boardA: number, refA: string, boardB: number, refB: string): number {
  if (boardA !== boardB) return boardA - boardB;
  return compareRefs(refA, refB);
}

/**
 * A string whose plain (code unit) order is the natural order of compareRefs, up to its final
 * exact tie-break: letters lower-cased (ASCII), each digit run as \u0001, its value zero-padded to
 * 20 digits, then a character counting its leading zeros. Null for a digit run longer than 20
 * (then compareRefs itself must be used).
 */
export function naturalKey(ref: string): string | null {
  let out = '';
  const n = ref.length;
  let i = 0;
  while (i < n) {
    const ch = ref.charCodeAt(i);
    if (isDigit(ch)) {
      let e = i;
      while (e < n && isDigit(ref.charCodeAt(e))) e++;
      let st = i;
      while (st < e - 1 && ref.charCodeAt(st) === 48) st++;
      const digits = ref.slice(st, e);
      if (digits.length > 20) return null;
      out += '\u0001' + '00000000000000000000'.slice(digits.length) + digits + String.fromCharCode(1 + st - i);
      i = e;
    } else {
      out += String.fromCharCode(lower(ch));
      i++;
    }
  }
  return out;
}

/** Sort references in natural order (compareRefs), fast for long lists: each reference's natural
 * key is made once, then plain string comparison does the work. */
export function sortRefsNatural(refs: string[]): string[] {
  const simple = sortSimpleRefs(refs);
  if (simple) return simple;
  const items: { k: string; r: string }[] = new Array(refs.length);
  for (let i = 0; i < refs.length; i++) {
    const k = naturalKey(refs[i]);
    if (k === null) return [...refs].sort(compareRefs);
    items[i] = { k, r: refs[i] };
  }
  items.sort((a, b) => (a.k < b.k ? -1 : a.k > b.k ? 1 : compareRefs(a.r, b.r)));
  const out: string[] = new Array(refs.length);
  for (let i = 0; i < items.length; i++) out[i] = items[i].r;
  return out;
}

/** Letters, then a number without leading zeros: the shape of nearly every reference designator. */
const SIMPLE_REF = /^([A-Za-z]+)(0|[1-9][0-9]{0,8})$/;

/**
 * The common case fast: when every reference is letters then a number, the natural order is the
 * lower-cased letters in code-unit order (a shorter prefix first, as compareRefs puts a digit
 * before a letter), then the number. One exact numeric key per reference, sorted natively. Null
 * when a reference has another shape or two differ only in case (compareRefs decides those).
 */
function sortSimpleRefs(refs: string[]): string[] | null {
  const n = refs.length;
  const prefixOf: string[] = new Array(n);
  const num = new Float64Array(n);
  const prefixes = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const m = SIMPLE_REF.exec(refs[i]);
    if (m === null) return null;
    const p = m[1].toLowerCase();
    prefixOf[i] = p;
    num[i] = +m[2];
    prefixes.set(p, 0);
  }
  const list = [...prefixes.keys()].sort();
  if (list.length * 1e9 * n >= 2 ** 53) return null;
  for (let r = 0; r < list.length; r++) prefixes.set(list[r], r);
  const key = new Float64Array(n);
  for (let i = 0; i < n; i++) key[i] = (prefixes.get(prefixOf[i])! * 1e9 + num[i]) * n + i;
  key.sort();
  const out: string[] = new Array(n);
  let prev = -1;
  for (let t = 0; t < n; t++) {
    const i = key[t] % n;
    const value = (key[t] - i) / n;
    if (value === prev) return null;
    prev = value;
    out[t] = refs[i];
  }
  return out;
}
