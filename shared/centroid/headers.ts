// Header recognition: case- and punctuation-insensitive families of column names, and the unit
// suffix a header may carry (`X(mil)`, `PosX [in]`, `Center-X(mm)`, `Mid X mm`).
import type { Units } from '../core';

export const FIELDS = ['ref', 'x', 'y', 'rotation', 'side', 'footprint', 'value', 'partNumber', 'dnp'] as const;
export type Field = (typeof FIELDS)[number];
export const REQUIRED_FIELDS: readonly Field[] = ['ref', 'x', 'y', 'rotation'];

/** normalised spellings (lowercase letters and digits only) → field */
const FAMILIES: Record<Field, string[]> = {
  ref: ['ref', 'refdes', 'designator', 'reference', 'referencedesignator', 'refdesignator'],
  x: ['x', 'posx', 'midx', 'centerx', 'centrex', 'refx', 'locx', 'positionx', 'xpos', 'xposition', 'xcenter', 'xloc'],
  y: ['y', 'posy', 'midy', 'centery', 'centrey', 'refy', 'locy', 'positiony', 'ypos', 'yposition', 'ycenter', 'yloc'],
  rotation: ['rot', 'rotation', 'angle', 'orientation', 'rotate', 'theta'],
  side: ['side', 'layer', 'tb', 'topbottom', 'boardside', 'mountside'],
  footprint: ['footprint', 'package', 'pattern', 'case', 'casepackage', 'packagename', 'footprintname', 'pcbfootprint'],
  value: ['value', 'val', 'comment'],
  partNumber: ['mpn', 'partnumber', 'pn', 'manufacturerpart', 'manufacturerpartnumber', 'mfrpn', 'mfrpartnumber', 'partno'],
  dnp: ['dnp', 'dni', 'donotplace', 'donotpopulate', 'fitted', 'populate', 'populated', 'place', 'mount', 'mounted'],
};

/** spellings whose meaning is inverted (true = placed) */
const INVERTED_DNP = new Set(['fitted', 'populate', 'populated', 'place', 'mount', 'mounted']);

const LOOKUP = new Map<string, Field>();
for (const f of FIELDS) for (const s of FAMILIES[f]) LOOKUP.set(s, f);

const UNIT_SUFFIX = /(?:^|[\s([{_\-/])\s*(mm|mils?|in|inch|inches|thou)\s*[)\]}]?\s*$/i;

export function unitWord(w: string): Units | null {
  const s = w.toLowerCase();
  if (s === 'mm') return 'mm';
  if (s === 'mil' || s === 'mils' || s === 'thou' || s === 'th') return 'mil';
  if (s === 'in' || s === 'inch' || s === 'inches' || s === '"') return 'in';
  return null;
}

export interface HeaderInfo {
  /** as written, trimmed, BOM removed */
  raw: string;
  /** lowercase letters and digits, unit suffix removed */
  key: string;
  unit: Units | null;
  field: Field | null;
  invertedDnp: boolean;
}

export function analyseHeader(cell: string): HeaderInfo {
  const raw = cell.replace(/^\uFEFF/, '').trim();
  let name = raw;
  let unit: Units | null = null;
  const m = UNIT_SUFFIX.exec(raw);
  if (m && m.index > 0) {
    unit = unitWord(m[1]);
    name = raw.slice(0, m.index);
  }
  const key = name.toLowerCase().replace(/[^a-z0-9]/g, '');
  let field = LOOKUP.get(key) ?? null;
  // "X (mm)" style is covered above; "Xmm" / "PosXmil" without separator:
  if (!field && !unit) {
    const m2 = /^(.*?)(mm|mils?|inch)$/.exec(key);
    if (m2 && LOOKUP.has(m2[1]) && (LOOKUP.get(m2[1]) === 'x' || LOOKUP.get(m2[1]) === 'y')) {
      field = LOOKUP.get(m2[1])!;
      unit = unitWord(m2[2]);
    }
  }
  return { raw, key, unit, field, invertedDnp: field === 'dnp' && INVERTED_DNP.has(key) };
}

export function isField(s: string): s is Field {
  return (FIELDS as readonly string[]).includes(s);
}
