// Neutral placement list writer (PLACEMENT-LIST.md), CSV and JSON.
import type { RunResult, TransformResult } from '../pipeline/types';
import { csvField, fmt3, fmtRot3, fmtShort, sha256Hex } from './format';
import { CSV_HEADER, LIST_FORMAT, type ListMeta, type ListTransform, type PlacementList, type WriteOptions } from './types';

function isoUtc(g: Date | string | undefined): string {
  if (g === undefined) return new Date().toISOString();
  if (typeof g === 'string') {
    const d = new Date(g);
    if (Number.isNaN(d.getTime())) throw new RangeError(`generated: not a date: "${g}"`);
    return d.toISOString();
  }
  return g.toISOString();
}

const oneLine = (s: string) => s.replace(/[\r\n]+/g, ' ');

/** `model=similarity rotationDeg=0.42 scale=1.00015 tx=120.25 ty=60.5 rms=0.0079` (+ `shearDeg=` for affine). */
export function transformMetaLine(t: TransformResult | null): string {
  if (!t) return 'model=none';
  let s =
    `model=${t.model} rotationDeg=${fmtShort(t.rotationDeg, 6)} scale=${fmtShort(t.scale, 8)} ` +
    `tx=${fmtShort(t.tx, 4)} ty=${fmtShort(t.ty, 4)} rms=${fmtShort(t.rmsResidual, 4)}`;
  if (t.model === 'affine') s += ` shearDeg=${fmtShort(t.shearDeg, 6)}`;
  return s;
}

function listTransform(t: TransformResult | null): ListTransform | null {
  if (!t) return null;
  return { model: t.model, rotationDeg: t.rotationDeg, scale: t.scale, tx: t.tx, ty: t.ty, matrix: t.matrix, rmsResidual: t.rmsResidual };
}

/** Fiducials as listed: measured position when measured, else the output-frame position. */
function listFiducials(r: RunResult): { name: string; x: number; y: number }[] {
  return r.fiducials.map((f) => ({ name: f.name, x: f.measured ? f.measured.x : f.x, y: f.measured ? f.measured.y : f.y }));
}

function meta(r: RunResult, o: WriteOptions): ListMeta {
  return {
    program: oneLine(o.program ?? r.program ?? ''),
    revision: oneLine(o.revision ?? r.revision ?? ''),
    side: r.side,
    units: 'mm',
    frame: r.frame,
    transform: listTransform(r.transform),
    boards: r.boardsPlaced,
    placements: r.placements.count,
    generated: isoUtc(o.generated),
  };
}

/** The CSV body (header row and rows, `\n` after each), the bytes the checksum covers. */
export function placementCsvBody(r: RunResult): string {
  const p = r.placements;
  const n = p.count;
  const lines: string[] = [CSV_HEADER];
  const quoted = new Map<string | null, string>();
  const qc = (s: string | null): string => {
    let v = quoted.get(s);
    if (v === undefined) {
      v = s === null ? '' : csvField(s);
      quoted.set(s, v);
    }
    return v;
  };
  const heights = new Map<number, string>();
  const { seq, board, ref, x, y, rotation, packageName, nozzle, vision, bodyHeight, partNumber, value } = p;
  for (let i = 0; i < n; i++) {
    const h = bodyHeight[i];
    let hs = '';
    if (h === h) {
      hs = heights.get(h) ?? '';
      if (hs === '') {
        hs = fmtShort(h, 3);
        heights.set(h, hs);
      }
    }
    lines.push(
      seq[i] + ',' + board[i] + ',' + csvField(ref[i]) + ',' + fmt3(x[i]) + ',' + fmt3(y[i]) + ',' + fmtRot3(rotation[i]) + ',' +
      qc(packageName[i]) + ',' + qc(nozzle[i]) + ',' + qc(vision[i]) + ',' + hs + ',' + qc(partNumber[i]) + ',' + qc(value[i]),
    );
  }
  lines.push('');
  return lines.join('\n');
}

/** The neutral list as CSV, with its sha256 (hex digest of every byte after the metadata lines). */
export async function writePlacementListCsv(r: RunResult, o: WriteOptions = {}): Promise<{ text: string; sha256: string }> {
  const m = meta(r, o);
  const body = placementCsvBody(r);
  const sha256 = await sha256Hex(body);
  const head: string[] = [
    `# format: ${LIST_FORMAT}`,
    `# program: ${m.program}`,
    `# revision: ${m.revision}`,
    `# side: ${m.side}`,
    `# units: mm`,
    `# frame: ${m.frame}`,
    `# transform: ${transformMetaLine(r.transform)}`,
  ];
  for (const f of listFiducials(r)) head.push(`# fiducial: ${oneLine(f.name)} ${fmt3(f.x)} ${fmt3(f.y)}`);
  head.push(`# boards: ${m.boards}`, `# placements: ${m.placements}`, `# generated: ${m.generated}`, `# sha256: ${sha256}`);
  for (const bt of r.boardTransforms) head.push(`# board-transform: ${bt.board} ${transformMetaLine(bt.transform)}`);
  return { text: head.join('\n') + '\n' + body, sha256 };
}

/** The neutral list as a JSON object (numbers not rounded). */
export function placementListObject(r: RunResult, o: WriteOptions = {}): Omit<PlacementList, 'encoding'> {
  const p = r.placements;
  const placements: PlacementList['placements'] = [];
  for (let i = 0; i < p.count; i++) {
    const h = p.bodyHeight[i];
    placements.push({
      seq: p.seq[i],
      board: p.board[i],
      ref: p.ref[i],
      x: p.x[i],
      y: p.y[i],
      rotation: p.rotation[i],
      package: p.packageName[i],
      nozzle: p.nozzle[i],
      vision: p.vision[i],
      height: h === h ? h : null,
      partNumber: p.partNumber[i],
      value: p.value[i],
    });
  }
  return { format: LIST_FORMAT, meta: meta(r, o), fiducials: listFiducials(r), placements };
}

/** JSON text; `sha256` of that text is what the server sends as a header. */
export async function writePlacementListJson(r: RunResult, o: WriteOptions = {}): Promise<{ text: string; sha256: string }> {
  const text = JSON.stringify(placementListObject(r, o), null, 1) + '\n';
  return { text, sha256: await sha256Hex(text) };
}
