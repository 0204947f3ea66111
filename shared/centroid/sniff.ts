// Header sniffing of a centroid file: the delimiter and the header row are found by trying each
// delimiter on the first lines and keeping the one that recognises reference, X and Y columns.
import type { Field, HeaderInfo } from './headers';
import { FIELDS } from './headers';

export const DELIMS = [',', ';', '\t'] as const;
export type Delim = (typeof DELIMS)[number];
export const HEADER_SCAN_LINES = 200;

/** Split one line on a delimiter, honouring double quotes (for header sniffing only). */
export function splitLine(line: string, delim: string): string[] {
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

export interface HeaderCandidate {
  line: number;
  /** offset in text just after this line's end */
  next: number;
  delim: Delim;
  infos: HeaderInfo[];
  fields: Map<Field, number>;
}

export function isCommentLine(t: string): boolean {
  return t.startsWith('#') || t.startsWith('//') || t.startsWith(';') && t.length > 1 && !t.slice(1).includes(';');
}

export function mapFields(infos: HeaderInfo[], map: Partial<Record<Field, string>>): Map<Field, number> {
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


export function fieldLabel(f: Field): string {
  return f === 'ref' ? 'reference' : f === 'x' ? 'X' : f === 'y' ? 'Y' : f;
}
