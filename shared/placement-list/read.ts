// Neutral placement list reader: CSV (checksum verified) and JSON, back to the same placements.
import Papa from 'papaparse';
import { z } from 'zod';
import { EngineInputError } from '../core';
import { unneutraliseCell } from '../csv-safety';
import { sha256Hex } from './format';
import { CSV_HEADER, LIST_FORMAT, type ListMeta, type ListPlacement, type ListTransform, type PlacementList } from './types';

const KNOWN = ['format', 'program', 'revision', 'side', 'units', 'frame', 'transform', 'fiducial', 'boards', 'placements', 'generated', 'sha256'];

export interface ReadOptions {
  file?: string;
}

/** Read a list; CSV or JSON is told from the first non-blank character. */
export async function readPlacementList(text: string, opts: ReadOptions = {}): Promise<PlacementList> {
  const t = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  return /^\s*\{/.test(t) ? readPlacementListJson(t, opts) : readPlacementListCsv(t, opts);
}

function parseTransformLine(v: string, err: (m: string) => EngineInputError): ListTransform | null {
  const kv = new Map<string, string>();
  for (const tok of v.trim().split(/\s+/)) {
    const eq = tok.indexOf('=');
    if (eq <= 0) throw err(`transform: expected key=value, got "${tok}"`);
    kv.set(tok.slice(0, eq), tok.slice(eq + 1));
  }
  const model = kv.get('model');
  if (!model) throw err('transform: no model=');
  if (model === 'none') return null;
  const num = (k: string) => {
    const s = kv.get(k);
    const n = s === undefined ? NaN : Number(s);
    if (!Number.isFinite(n)) throw err(`transform: ${k}= expected a number, got "${s ?? ''}"`);
    return n;
  };
  const rotationDeg = num('rotationDeg'), scale = num('scale'), tx = num('tx'), ty = num('ty');
  const r = (rotationDeg * Math.PI) / 180;
  // The CSV line does not carry the full matrix; rebuild the similarity part (affine lists carry shear only).
  const c = scale * Math.cos(r), s = scale * Math.sin(r);
  return { model, rotationDeg, scale, tx, ty, matrix: [[c, -s, tx], [s, c, ty]], rmsResidual: num('rms') };
}

export async function readPlacementListCsv(text: string, opts: ReadOptions = {}): Promise<PlacementList> {
  const file = opts.file;
  let pos = 0;
  let line = 0;
  const metaKv: { key: string; value: string; line: number }[] = [];
  while (pos < text.length && text.startsWith('#', pos)) {
    let end = text.indexOf('\n', pos);
    if (end < 0) end = text.length;
    line++;
    const raw = text.slice(pos, end).replace(/\r$/, '');
    const m = /^#\s*([A-Za-z0-9_-]+)\s*:\s?(.*)$/.exec(raw);
    if (!m) throw new EngineInputError(`expected a metadata line "# key: value", got "${raw}"`, { file, line, code: 'bad-list' });
    metaKv.push({ key: m[1], value: m[2].trim(), line });
    pos = end + 1;
  }
  const body = text.slice(pos);
  const get = (k: string) => metaKv.find((e) => e.key === k);
  const need = (k: string) => {
    const e = get(k);
    if (!e) throw new EngineInputError(`missing metadata line "# ${k}: ..."`, { file, field: k, code: 'bad-list' });
    return e;
  };
  const fmt = need('format');
  if (fmt.value !== LIST_FORMAT) {
    throw new EngineInputError(`format "${fmt.value}" is not ${LIST_FORMAT}`, { file, line: fmt.line, field: 'format', code: 'bad-list' });
  }
  const shaLine = need('sha256');
  const actual = await sha256Hex(body);
  if (actual !== shaLine.value.toLowerCase()) {
    throw new EngineInputError(
      `checksum mismatch: the file says sha256 ${shaLine.value} but the rows hash to ${actual}; the list was changed after it was written`,
      { file, line: shaLine.line, field: 'sha256', code: 'checksum-mismatch' },
    );
  }
  const intMeta = (k: string) => {
    const e = need(k);
    const n = Number(e.value);
    if (!Number.isInteger(n) || n < 0) throw new EngineInputError(`${k}: expected a whole number, got "${e.value}"`, { file, line: e.line, field: k, code: 'bad-list' });
    return n;
  };
  const side = need('side');
  if (side.value !== 'top' && side.value !== 'bottom') throw new EngineInputError(`side: expected top or bottom, got "${side.value}"`, { file, line: side.line, field: 'side', code: 'bad-list' });
  const frame = need('frame');
  if (frame.value !== 'machine' && frame.value !== 'panel') throw new EngineInputError(`frame: expected machine or panel, got "${frame.value}"`, { file, line: frame.line, field: 'frame', code: 'bad-list' });
  const units = need('units');
  if (units.value !== 'mm') throw new EngineInputError(`units: expected mm, got "${units.value}"`, { file, line: units.line, field: 'units', code: 'bad-list' });
  const tl = need('transform');
  const transform = parseTransformLine(tl.value, (m) => new EngineInputError(m, { file, line: tl.line, field: 'transform', code: 'bad-list' }));
  const fiducials = metaKv
    .filter((e) => e.key === 'fiducial')
    .map((e) => {
      const toks = e.value.split(/\s+/);
      const x = Number(toks[toks.length - 2]), y = Number(toks[toks.length - 1]);
      if (toks.length < 3 || !Number.isFinite(x) || !Number.isFinite(y)) {
        throw new EngineInputError(`fiducial: expected "NAME x y", got "${e.value}"`, { file, line: e.line, field: 'fiducial', code: 'bad-list' });
      }
      return { name: toks.slice(0, -2).join(' '), x, y };
    });
  const meta: ListMeta = {
    program: get('program')?.value ?? '',
    revision: get('revision')?.value ?? '',
    side: side.value,
    units: 'mm',
    frame: frame.value,
    transform,
    boards: intMeta('boards'),
    placements: intMeta('placements'),
    generated: need('generated').value,
    sha256: shaLine.value.toLowerCase(),
    extra: metaKv.filter((e) => !KNOWN.includes(e.key)).map(({ key, value }) => ({ key, value })),
  };

  const headerEnd = body.indexOf('\n');
  const header = (headerEnd < 0 ? body : body.slice(0, headerEnd)).replace(/\r$/, '');
  const headerLine = line + 1;
  if (header !== CSV_HEADER) {
    throw new EngineInputError(`expected the header row "${CSV_HEADER}", got "${header}"`, { file, line: headerLine, code: 'bad-list' });
  }
  const rows = Papa.parse<string[]>(headerEnd < 0 ? '' : body.slice(headerEnd + 1), { delimiter: ',', newline: '\n', skipEmptyLines: false }).data;
  for (const row of rows) for (const i of [2, 6, 7, 8, 10, 11]) if (row[i]) row[i] = unneutraliseCell(row[i]); // the writer's formula guard: shared/csv-safety
  const placements: ListPlacement[] = [];
  const COLS = CSV_HEADER.split(',');
  let l = headerLine;
  for (const row of rows) {
    l++;
    if (row.length === 1 && row[0] === '') continue;
    if (row.length !== 12) throw new EngineInputError(`expected 12 fields, found ${row.length}`, { file, line: l, code: 'bad-list' });
    const num = (i: number, int = false): number => {
      const s = row[i];
      const n = s === '' ? NaN : Number(s);
      if (!Number.isFinite(n) || (int && !Number.isInteger(n))) {
        throw new EngineInputError(`expected a ${int ? 'whole ' : ''}number, got "${s}"`, { file, line: l, column: COLS[i], code: 'bad-number' });
      }
      return n;
    };
    const opt = (i: number) => (row[i] === '' ? null : row[i]);
    placements.push({
      seq: num(0, true),
      board: num(1, true),
      ref: row[2],
      x: num(3),
      y: num(4),
      rotation: num(5),
      package: opt(6),
      nozzle: opt(7),
      vision: opt(8),
      height: row[9] === '' ? null : num(9),
      partNumber: row[10],
      value: row[11],
    });
  }
  if (placements.length !== meta.placements) {
    throw new EngineInputError(`the metadata says ${meta.placements} placements but there are ${placements.length} rows`, { file, field: 'placements', code: 'bad-list' });
  }
  return { format: LIST_FORMAT, encoding: 'csv', meta, fiducials, placements };
}

const num = z.number().finite();
const str = z.string();
const listJsonSchema = z.object({
  format: z.literal(LIST_FORMAT),
  meta: z.object({
    program: str,
    revision: str,
    side: z.enum(['top', 'bottom']),
    units: z.literal('mm'),
    frame: z.enum(['machine', 'panel']),
    transform: z
      .object({
        model: str,
        rotationDeg: num,
        scale: num,
        tx: num,
        ty: num,
        matrix: z.tuple([z.tuple([num, num, num]), z.tuple([num, num, num])]),
        rmsResidual: num,
      })
      .nullable(),
    boards: z.number().int().nonnegative(),
    placements: z.number().int().nonnegative(),
    generated: str,
  }),
  fiducials: z.array(z.object({ name: str, x: num, y: num })),
  placements: z.array(
    z.object({
      seq: z.number().int().positive(),
      board: z.number().int().positive(),
      ref: str,
      x: num,
      y: num,
      rotation: num,
      package: str.nullable(),
      nozzle: str.nullable(),
      vision: str.nullable(),
      height: num.nullable(),
      partNumber: str,
      value: str,
    }),
  ),
});

export async function readPlacementListJson(text: string, opts: ReadOptions = {}): Promise<PlacementList> {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    throw new EngineInputError(`not valid JSON: ${(e as Error).message}`, { file: opts.file, code: 'bad-json' });
  }
  const r = listJsonSchema.safeParse(data);
  if (!r.success) {
    const is = r.error.issues[0];
    throw new EngineInputError(is.message, { file: opts.file, field: is.path.map(String).join('.'), code: 'bad-list' });
  }
  if (r.data.placements.length !== r.data.meta.placements) {
    throw new EngineInputError(`meta.placements is ${r.data.meta.placements} but there are ${r.data.placements.length} placements`, {
      file: opts.file, field: 'meta.placements', code: 'bad-list',
    });
  }
  return { ...r.data, encoding: 'json' };
}
