// The one formatter of lengths and angles shown to people and written to files: a fixed number
// of decimals (3 unless asked otherwise), rounded half away from zero, never "-0.000" (a value
// that rounds to zero is written without its sign). The client, the set-up sheet, the finding
// messages, the engine's warnings and the placement list all use it.

const POW10 = [1, 10, 100, 1000, 10000, 100000, 1000000];

/** `v` with exactly `decimals` (0–6) decimals, half away from zero, never a negative zero. */
export function fixed(v: number, decimals = 3): string {
  if (decimals === 3) return fixed3(v);
  if (!Number.isFinite(v)) return String(v);
  const p = POW10[decimals];
  if (p === undefined) throw new RangeError(`decimals must be a whole number 0–6, got ${decimals}`);
  const neg = v < 0;
  const q = Math.round((neg ? -v : v) * p);
  if (q === 0) return decimals === 0 ? '0' : '0.' + '0'.repeat(decimals);
  const s = q >= 1e15 ? ((neg ? -v : v).toFixed(decimals)) : integerWithPoint(q, decimals);
  return neg ? '-' + s : s;
}

function integerWithPoint(q: number, decimals: number): string {
  if (decimals === 0) return String(q);
  const digits = String(q).padStart(decimals + 1, '0');
  return digits.slice(0, digits.length - decimals) + '.' + digits.slice(digits.length - decimals);
}

/** `v` with exactly 3 decimals (the fast path: the placement list writes millions of them). */
export function fixed3(v: number): string {
  const neg = v < 0;
  const a = neg ? -v : v;
  if (!(a < 1e12)) return Number.isFinite(v) ? v.toFixed(3) : String(v);
  const q = Math.round(a * 1000);
  if (q === 0) return '0.000';
  const i = Math.floor(q / 1000);
  const f = q - i * 1000;
  const fs = f < 10 ? '00' + f : f < 100 ? '0' + f : '' + f;
  return (neg ? '-' : '') + i + '.' + fs;
}

/** A length for people: "12.700 mm"; "—" when there is none. */
export function lengthText(v: number | null | undefined, decimals = 3): string {
  return v == null || !Number.isFinite(v) ? '—' : `${fixed(v, decimals)} mm`;
}

/** An angle for people: "90.000°"; "—" when there is none. */
export function angleText(v: number | null | undefined, decimals = 3): string {
  return v == null || !Number.isFinite(v) ? '—' : `${fixed(v, decimals)}°`;
}

/**
 * A size in bytes as people read it, in decimal units (SI prefixes: 1 kB = 1000 bytes, 1 MB =
 * 1000 kB): "812 B", "41.2 kB", "1.3 MB"; "—" when there is none. The one file-size rule, for the
 * pages and the server's messages alike.
 */
export function byteSizeText(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '—';
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 999_950) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}
