// CSV bulk import of packages: parse (papaparse), a preview with per-row errors naming the line,
// then a commit in one transaction that writes everything or nothing.
import Papa from 'papaparse';
import type { EntityManager } from 'typeorm';
import {
  createPackageInputSchema,
  CSV_COLUMNS,
  DEFAULT_COURTYARD_MM,
  PACKAGE_FAMILIES,
  type CreatePackageInput,
  type CsvPreview,
  type CsvRow,
} from '../../../shared/schemas/library.schema';
import { LibraryAlias } from '../../db/entities/library-alias.entity';
import { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import type { FieldError } from '../../lib/errors';

type Column = (typeof CSV_COLUMNS)[number];
const norm = (s: string) => s.replace(/^\uFEFF/, '').toLowerCase().replace(/[\s_\-()[\]]|mm$/g, '');
const HEADER: Record<string, Column> = Object.fromEntries(CSV_COLUMNS.map((c) => [norm(c), c]));
Object.assign(HEADER, { bodylength: 'length', bodywidth: 'width', bodyheight: 'height', package: 'name', rotation: 'rotationOffset', tape: 'tapeWidth', pitch: 'tapePitch', polarized: 'polarised' });

/** Field of the package input → its CSV column (for error paths). */
const COLUMN_OF: Record<string, Column> = { bodyLength: 'length', bodyWidth: 'width', bodyHeight: 'height' };

function num(v: string | undefined, blank: number | null): number | null | string {
  const s = (v ?? '').trim();
  if (s === '') return blank;
  const n = Number(s);
  return Number.isFinite(n) ? n : s;
}
function bool(v: string | undefined): boolean | string {
  const s = (v ?? '').trim().toLowerCase();
  if (['', 'no', 'n', 'false', '0'].includes(s)) return false;
  if (['yes', 'y', 'true', '1', 'x'].includes(s)) return true;
  return s;
}
const list = (v: string | undefined) => (v ?? '').split(/[\s|;]+/).map((s) => s.trim()).filter(Boolean);

export interface ParsedCsv {
  columns: string[];
  headerErrors: FieldError[];
  rows: { line: number; cells: Partial<Record<Column, string>> }[];
}

/** Parses the CSV; line numbers are the physical lines of the file (1-based, header is line 1). */
export function parseCsv(text: string): ParsedCsv {
  const lineStarts: number[] = [0];
  for (let i = 0; i < text.length; i++) if (text[i] === '\n') lineStarts.push(i + 1);
  const lineAt = (offset: number) => {
    let lo = 0, hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lineStarts[mid] <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  };
  const records: { line: number; data: string[] }[] = [];
  let prev = 0;
  Papa.parse<string[]>(text, {
    skipEmptyLines: false,
    step: (r) => {
      // Skip leading newline characters left by the previous row's end.
      let start = prev;
      while (text[start] === '\r' || text[start] === '\n') start++;
      records.push({ line: lineAt(start), data: r.data });
      prev = r.meta.cursor;
    },
  });
  const nonEmpty = records.filter((r) => r.data.some((c) => c.trim() !== ''));
  if (nonEmpty.length === 0) return { columns: [], headerErrors: [{ path: 'line 1', message: 'The file has no header row' }], rows: [] };
  const [head, ...body] = nonEmpty;
  const headerErrors: FieldError[] = [];
  const map: (Column | null)[] = head.data.map((h) => {
    const c = HEADER[norm(h)];
    if (!c && h.trim()) headerErrors.push({ path: `line ${head.line}`, message: `Unknown column "${h.trim()}"; known: ${CSV_COLUMNS.join(', ')}` });
    return c ?? null;
  });
  for (const req of ['name', 'length', 'width', 'height'] as const) {
    if (!map.includes(req)) headerErrors.push({ path: `line ${head.line}`, message: `The column "${req}" is missing` });
  }
  const rows = body.map((r) => {
    const cells: Partial<Record<Column, string>> = {};
    map.forEach((c, i) => {
      if (c) cells[c] = r.data[i] ?? '';
    });
    return { line: r.line, cells };
  });
  return { columns: head.data.map((h) => h.trim()), headerErrors, rows };
}

function toCandidate(c: Partial<Record<Column, string>>): Record<string, unknown> {
  const family = (c.family ?? '').trim();
  const fam = family === '' ? 'other' : (PACKAGE_FAMILIES.find((f) => f.toLowerCase() === family.toLowerCase()) ?? family);
  return {
    name: (c.name ?? '').trim(),
    family: fam,
    bodyLength: num(c.length, null),
    bodyWidth: num(c.width, null),
    bodyHeight: num(c.height, null),
    offsetX: num(c.offsetX, 0),
    offsetY: num(c.offsetY, 0),
    courtyard: num(c.courtyard, DEFAULT_COURTYARD_MM),
    rotationOffset: num(c.rotationOffset, 0),
    polarised: bool(c.polarised),
    overhang: bool(c.overhang),
    nozzles: list(c.nozzles),
    vision: (c.vision ?? '').trim() || null,
    tapeWidth: num(c.tapeWidth, null),
    tapePitch: num(c.tapePitch, null),
    feeder: (c.feeder ?? '').trim().toLowerCase() || 'tape',
    padLength: num(c.padLength, null),
    padWidth: num(c.padWidth, null),
    padCount: num(c.padCount, null),
    aliases: list(c.aliases),
    notes: (c.notes ?? '').trim(),
  };
}

export interface CheckedCsv extends CsvPreview {
  valid: { line: number; input: CreatePackageInput; existingId: string | null }[];
}

/** Validates every row against the schema, the library and the other rows. */
export async function checkCsv(m: EntityManager, text: string): Promise<CheckedCsv> {
  const parsed = parseCsv(text);
  const [packages, aliases, nozzles, presets] = await Promise.all([
    m.getRepository(LibraryPackage).find(),
    m.getRepository(LibraryAlias).find(),
    m.getRepository(LibraryNozzle).find(),
    m.getRepository(LibraryVisionPreset).find(),
  ]);
  const nozzleNames = new Set(nozzles.map((n) => n.name));
  const presetNames = new Set(presets.map((p) => p.name));
  const pkgByKey = new Map(packages.map((p) => [p.nameKey, p]));
  const aliasOwner = new Map(aliases.map((a) => [a.patternKey, a.packageId]));
  const seenNames = new Map<string, number>();
  const seenAliases = new Map<string, number>();
  const rows: CsvRow[] = [];
  const valid: CheckedCsv['valid'] = [];
  if (parsed.headerErrors.length) rows.push({ line: 1, name: '(header)', action: 'create', errors: parsed.headerErrors.map((e) => ({ path: 'header', message: e.message })), values: null });
  for (const r of parsed.rows) {
    const cand = toCandidate(r.cells);
    const errors: { path: string; message: string }[] = [];
    const res = createPackageInputSchema.safeParse(cand);
    const name = String(cand.name);
    const key = name.toLowerCase();
    const existing = pkgByKey.get(key) ?? null;
    if (!res.success) {
      for (const i of res.error.issues) {
        const head = String(i.path[0] ?? 'row');
        errors.push({ path: COLUMN_OF[head] ?? head, message: i.message });
      }
    } else {
      const v = res.data;
      v.nozzles.forEach((n) => { if (!nozzleNames.has(n)) errors.push({ path: 'nozzles', message: `Nozzle ${n} is not in the library` }); });
      if (v.vision && !presetNames.has(v.vision)) errors.push({ path: 'vision', message: `Vision preset ${v.vision} is not in the library` });
      v.aliases.forEach((a) => {
        const k = a.toLowerCase();
        const owner = aliasOwner.get(k);
        if (pkgByKey.has(k) || seenNames.has(k) || k === key) errors.push({ path: 'aliases', message: `"${a}" is a package name` });
        else if (owner && owner !== existing?.id) errors.push({ path: 'aliases', message: `"${a}" already points to package ${packages.find((p) => p.id === owner)?.name}` });
        else if (seenAliases.has(k)) errors.push({ path: 'aliases', message: `"${a}" is also an alias on line ${seenAliases.get(k)}` });
        seenAliases.set(k, r.line);
      });
      const ownerOfName = aliasOwner.get(key);
      if (ownerOfName && ownerOfName !== existing?.id) errors.push({ path: 'name', message: `"${name}" is already an alias of package ${packages.find((p) => p.id === ownerOfName)?.name}` });
    }
    if (name && seenNames.has(key)) errors.push({ path: 'name', message: `${name} is also on line ${seenNames.get(key)}` });
    if (name) seenNames.set(key, r.line);
    rows.push({ line: r.line, name, action: existing ? 'update' : 'create', errors, values: res.success ? (res.data as unknown as Record<string, unknown>) : null });
    if (res.success && errors.length === 0) valid.push({ line: r.line, input: res.data, existingId: existing?.id ?? null });
  }
  const errorCount = rows.reduce((s, r) => s + r.errors.length, 0);
  return { columns: parsed.columns, rows, errorCount, valid };
}
