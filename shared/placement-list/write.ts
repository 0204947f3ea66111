// Neutral placement list writer (shared/placement-list/README.md), CSV and JSON.
import type { RunResult, TransformResult } from '../core';
import { csvField } from '../csv-safety'; // RFC 4180 fields with spreadsheet formulas neutralised (OWASP)
import { fmt3, fmtRot3, fmtShort, sha256Hex } from './format';
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

const encoder = new TextEncoder();
const decoder = new TextDecoder();

/** A growable byte buffer with ASCII number writers (the CSV body is built as bytes: it is what
 * the checksum covers, and it keeps 100,000 rows from becoming millions of short-lived strings). */
class ByteWriter {
  buf: Uint8Array;
  len = 0;
  constructor(capacity: number) {
    this.buf = new Uint8Array(Math.max(1024, capacity));
  }
  ensure(extra: number): void {
    if (this.len + extra <= this.buf.length) return;
    const next = new Uint8Array(Math.max(this.buf.length * 2, this.len + extra));
    next.set(this.buf.subarray(0, this.len));
    this.buf = next;
  }
  byte(b: number): void {
    this.buf[this.len++] = b;
  }
  bytes(src: Uint8Array): void {
    const n = src.length;
    const buf = this.buf;
    let p = this.len;
    if (n < 16) for (let i = 0; i < n; i++) buf[p++] = src[i];
    else {
      buf.set(src, p);
      p += n;
    }
    this.len = p;
  }
  /** a non-negative integer below 2^53 */
  uint(v: number): void {
    const buf = this.buf;
    if (v < 10) {
      buf[this.len++] = 48 + v;
      return;
    }
    let digits = 1;
    for (let t = v; t >= 10; t = Math.floor(t / 10)) digits++;
    let p = this.len + digits;
    this.len = p;
    for (let t = v; ; ) {
      const q = Math.floor(t / 10);
      buf[--p] = 48 + (t - q * 10);
      if (q === 0) break;
      t = q;
    }
  }
  /** like fmt3: 3 decimals, half away from zero, never "-0.000"; `rot` writes 360.000 as 0.000 */
  fixed3(v: number, rot = false): void {
    const neg = v < 0;
    const a = neg ? -v : v;
    if (!(a < 1e12)) {
      this.bytes(encoder.encode(rot ? fmtRot3(v) : fmt3(v)));
      return;
    }
    let q = Math.round(a * 1000);
    if (rot && q === 360000) q = 0;
    if (q === 0) {
      this.bytes(ZERO3);
      return;
    }
    if (neg) this.byte(45);
    const i = Math.floor(q / 1000);
    const f = q - i * 1000;
    this.uint(i);
    const buf = this.buf;
    let p = this.len;
    buf[p++] = 46;
    buf[p++] = 48 + Math.floor(f / 100);
    buf[p++] = 48 + (Math.floor(f / 10) % 10);
    buf[p++] = 48 + (f % 10);
    this.len = p;
  }
}
const ZERO3 = encoder.encode('0.000');

interface RowCache {
  ref: string;
  pkg: string | null;
  noz: string | null;
  vis: string | null;
  h: number;
  pn: string;
  val: string;
  refBytes: Uint8Array;
  /** `,package,nozzle,vision,height,part_number,value\n` */
  tail: Uint8Array;
}

/** The CSV body (header row and rows, `\n` after each) as UTF-8 bytes: what the checksum covers. */
export function placementCsvBodyBytes(r: RunResult): Uint8Array {
  const p = r.placements;
  const n = p.count;
  const w = new ByteWriter(64 + n * 72);
  w.bytes(encoder.encode(CSV_HEADER + '\n'));
  const { seq, board, ref, x, y, rotation, packageName, nozzle, vision, bodyHeight, partNumber, value, sourceIndex } = p;
  const heights = new Map<number, string>();
  const q = (s: string | null) => (s === null ? '' : csvField(s));
  // rows of the same source part on other boards share ref and tail: cache them per source part,
  // checked against the current strings (identical strings compare by reference)
  const cache: (RowCache | undefined)[] = [];
  for (let i = 0; i < n; i++) {
    const src = sourceIndex[i];
    let c = cache[src];
    const rf = ref[i], pk = packageName[i], nz = nozzle[i], vs = vision[i], h = bodyHeight[i], pn = partNumber[i], vl = value[i];
    if (
      c === undefined || c.ref !== rf || c.pkg !== pk || c.noz !== nz || c.vis !== vs ||
      !(c.h === h || (h !== h && c.h !== c.h)) || c.pn !== pn || c.val !== vl
    ) {
      let hs = '';
      if (h === h) {
        hs = heights.get(h) ?? '';
        if (hs === '') {
          hs = fmtShort(h, 3);
          heights.set(h, hs);
        }
      }
      c = {
        ref: rf, pkg: pk, noz: nz, vis: vs, h, pn, val: vl,
        refBytes: encoder.encode(csvField(rf)),
        tail: encoder.encode(',' + q(pk) + ',' + q(nz) + ',' + q(vs) + ',' + hs + ',' + q(pn) + ',' + q(vl) + '\n'),
      };
      if (src >= 0) cache[src] = c;
    }
    w.ensure(80 + c.refBytes.length + c.tail.length);
    w.uint(seq[i]);
    w.byte(44);
    w.uint(board[i]);
    w.byte(44);
    w.bytes(c.refBytes);
    w.byte(44);
    w.fixed3(x[i]);
    w.byte(44);
    w.fixed3(y[i]);
    w.byte(44);
    w.fixed3(rotation[i], true);
    w.bytes(c.tail);
  }
  return w.buf.subarray(0, w.len);
}

/** The CSV body as text (see placementCsvBodyBytes). */
export function placementCsvBody(r: RunResult): string {
  return decoder.decode(placementCsvBodyBytes(r));
}

/** The neutral list as CSV, with its sha256 (hex digest of every byte after the metadata lines). */
export async function writePlacementListCsv(r: RunResult, o: WriteOptions = {}): Promise<{ text: string; sha256: string }> {
  const m = meta(r, o);
  const bodyBytes = placementCsvBodyBytes(r);
  const sha256 = await sha256Hex(bodyBytes);
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
  return { text: head.join('\n') + '\n' + decoder.decode(bodyBytes), sha256 };
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
