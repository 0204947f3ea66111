// Number formatting and CSV quoting for the neutral list (3 decimals: shared/core/format.ts).
import { fixed3 } from '../core';

/** `v` with exactly 3 decimals, half away from zero, never "-0.000" (the engine's one formatter). */
export const fmt3 = fixed3;

/** A rotation in [0, 360) with 3 decimals; a value that rounds to 360.000 is written 0.000. */
export function fmtRot3(v: number): string {
  const s = fmt3(v);
  return s === '360.000' ? '0.000' : s;
}

/** Shortest form of `v` rounded to `d` decimals ("0.42", "1.00015"); never "-0". */
export function fmtShort(v: number, d: number): string {
  const n = Number(v.toFixed(d));
  return String(n === 0 ? 0 : n);
}

const NEEDS_QUOTE = /[",\r\n]/;

/** RFC 4180 field. */
export function csvField(s: string): string {
  return NEEDS_QUOTE.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s;
}

const HEX: string[] = [];
for (let i = 0; i < 256; i++) HEX.push(i.toString(16).padStart(2, '0'));

/** SHA-256 of the UTF-8 bytes of `text`, hex, through Web Crypto (browser and Node). */
export async function sha256Hex(text: string | Uint8Array): Promise<string> {
  const subtle = globalThis.crypto?.subtle;
  if (!subtle) throw new Error('Web Crypto (crypto.subtle) is not available in this runtime');
  const bytes = typeof text === 'string' ? new TextEncoder().encode(text) : text;
  const digest = new Uint8Array(await subtle.digest('SHA-256', bytes as BufferSource));
  let out = '';
  for (let i = 0; i < digest.length; i++) out += HEX[digest[i]];
  return out;
}
