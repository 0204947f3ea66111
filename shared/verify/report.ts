// Turns the compact records of a check into finding objects: refs, a message a person
// understands, geometry to draw, a stable key; sorted and capped.

import {
  FINDING_KINDS,
  type Finding,
  type FindingGeometry,
  type FindingKind,
} from '../schemas/finding.schema';
import {
  convexGap,
  convexIntersectionPolygon,
  nearestPointOnRect,
  rectCorners,
  rectIntersectionPolygon,
  rectSatDepth,
  pointRectDistance,
} from './geom';
import {
  verifyProbe,
  FindingSink,
  K_BODY,
  K_BOARD_OVERLAP,
  K_COURTYARD,
  K_FIDUCIAL,
  K_NO_NOZZLE,
  K_NO_PACKAGE,
  K_NOZZLE_SIZE,
  K_OFF_BOARD,
  K_OFF_PANEL,
  K_OVERHANG,
  K_PANEL_REACH,
  K_REACH,
  K_SHADOW,
  RAW_KINDS,
} from './sink';
import { SIDE_NAMES, type VerifyInput, type VerifyResult } from './types';
import type { Prepared, PreparedOutlines } from './prepare';
import { fixed3 } from '../core';
import { RAW, sortKeys, sortOrder } from './report-order';


/** Millimetres in a message: 3 decimals, never "-0.000" (the engine's one formatter). */
export const fmtMm = fixed3;

const NO_BOARDS: number[] = [];

/** The stable key of a finding: kind plus its sorted refs, or its boards for panel kinds. */
export function findingKey(kind: FindingKind, refs: string[], boards: number[]): string {
  if (refs.length === 1) return kind + '|' + refs[0];
  if (refs.length === 2) return kind + '|' + refs[0] + '|' + refs[1];
  if (refs.length > 0) return `${kind}|${refs.join('|')}`;
  if (boards.length > 0) return `${kind}|boards:${boards.join(',')}`;
  return `${kind}|panel`;
}

type Draft = Finding;

export function buildReport(
  input: VerifyInput,
  P: Prepared,
  O: PreparedOutlines,
  sink: FindingSink,
  limit: number,
  placements: number,
  t0: number,
  now: () => number,
): VerifyResult {
  const n = sink.size;
  // sort the compact records first (numeric keys), then build objects for the first `limit` only
  // swap[k] = 1 when record k's second part comes first in "BOARD:REF" order
  const swap = new Uint8Array(n);
  const keys = sortKeys(input, sink, swap);
  const order = sortOrder(keys, n);
  if (verifyProbe.onPhase) verifyProbe.onPhase('sort');
  const ctx: Ctx = { input, P, O, sink, swap };
  const kept = Math.min(n, limit);
  const findings: Finding[] = new Array(kept);
  resetCaches(input.count);
  for (let t = 0; t < kept; t++) findings[t] = draft(ctx, order[t]);
  resetCaches(0);

  const byKind = Object.fromEntries(FINDING_KINDS.map((k) => [k, 0])) as Record<FindingKind, number>;
  let errors = 0;
  let warnings = 0;
  let truncated = n > limit;
  for (let r = 0; r < RAW_KINDS; r++) {
    const c = sink.found[r];
    if (c === 0) continue;
    byKind[RAW[r].kind] += c;
    if (RAW[r].severity === 'error') errors += c;
    else warnings += c;
    if (c > sink.kept[r]) truncated = true;
  }
  return {
    findings,
    summary: {
      errors,
      warnings,
      placements,
      byKind,
      truncated,
      seconds: (now() - t0) / 1000,
    },
  };
}


interface Ctx {
  input: VerifyInput;
  P: Prepared;
  O: PreparedOutlines;
  sink: FindingSink;
  swap: Uint8Array;
}

// Texts of a placement, made once per report (a part is often in more than one finding): a slot
// per placement seen, dense arrays of texts by slot.
let slotOf = new Int32Array(0);
let nameText: string[] = [];
let refText: string[] = [];
let tallText: (string | null)[] = [];

function resetCaches(n: number): void {
  slotOf = new Int32Array(n).fill(-1);
  nameText = [];
  refText = [];
  tallText = [];
}

function slot(input: VerifyInput, i: number): number {
  let k = slotOf[i];
  if (k < 0) {
    k = slotOf[i] = nameText.length;
    const r = input.ref[i];
    const b = input.board[i];
    nameText.push(`${r} on board ${b}`);
    refText.push(`${b}:${r}`);
    tallText.push(null);
  }
  return k;
}

/** "C12 on board 3" */
function partName(input: VerifyInput, i: number): string {
  return nameText[slot(input, i)];
}

/** "C12 on board 3 (0.45 mm tall)" (a taller neighbour is often in several findings) */
function tallName(input: VerifyInput, P: Prepared, i: number): string {
  const k = slot(input, i);
  let t = tallText[k];
  if (t === null) t = tallText[k] = `${nameText[k]} (${fmtMm(P.h[i])} mm tall)`;
  return t;
}

/** "3:C12" */
function boardRefOf(input: VerifyInput, i: number): string {
  return refText[slot(input, i)];
}

function singleDraft(
  input: VerifyInput, kind: FindingKind, severity: 'error' | 'warning', i: number, message: string,
  geometry: FindingGeometry, depth: number | null, distance: number | null, fiducial?: string,
): Draft {
  const b = input.board[i];
  const refs = [boardRefOf(input, i)];
  const finding: Finding = {
    key: findingKey(kind, refs, NO_BOARDS),
    kind,
    severity,
    side: SIDE_NAMES[input.side[i]],
    board: b,
    boards: [b],
    refs,
    message,
    geometry,
    depth,
    distance,
  };
  if (fiducial !== undefined) finding.fiducial = fiducial;
  return finding;
}

function pairDraft(
  input: VerifyInput, kind: FindingKind, severity: 'error' | 'warning', i: number, j: number, swapIJ: boolean,
  message: string, geometry: FindingGeometry, depth: number | null, distance: number | null,
): Draft {
  let first = i;
  let second = j;
  if (swapIJ) {
    first = j;
    second = i;
  }
  const board = input.board;
  const refs = [boardRefOf(input, first), boardRefOf(input, second)];
  const boards = board[first] === board[second] ? [board[first]] : board[first] < board[second] ? [board[first], board[second]] : [board[second], board[first]];
  return {
    key: findingKey(kind, refs, NO_BOARDS),
    kind,
    severity,
    side: SIDE_NAMES[input.side[i]],
    board: board[first],
    boards,
    refs,
    message,
    geometry,
    depth,
    distance,
  };
}

function bodyGeometry(P: Prepared, i: number): FindingGeometry {
  if (P.hx[i] === 0 && P.hy[i] === 0) return { type: 'point', x: P.cx[i], y: P.cy[i] };
  const q = new Float64Array(8);
  rectCorners(P.cx[i], P.cy[i], P.c[i], P.s[i], P.hx[i], P.hy[i], q);
  return polygonOf(q, 4);
}

/** Gap between two bodies of which one is a point (or a segment-thin rectangle). */
function pointGap(P: Prepared, p: number, q: number): number {
  const { cx, cy, c, s, hx, hy } = P;
  if (hx[p] * hy[p] === 0) return pointRectDistance(cx[p], cy[p], cx[q], cy[q], c[q], s[q], hx[q], hy[q]);
  return pointRectDistance(cx[q], cy[q], cx[p], cy[p], c[p], s[p], hx[p], hy[p]);
}

const quadA = new Float64Array(8);
const quadB = new Float64Array(8);

function draft(ctx: Ctx, k: number): Draft {
  const { input, P, O, sink } = ctx;
  const raw = sink.kind[k];
  const sw = ctx.swap[k] === 1;
  const { kind, severity } = RAW[raw];
  const a = sink.a[k];
  const b = sink.b[k];
  const depth = sink.depth[k];
  const dist = sink.dist[k];
  const { cx, cy, c, s, hx, hy, g } = P;

  switch (raw) {
    case K_BODY: {
      // geometry and depth from the pair in report order, so they do not depend on input order
      const p = sw ? b : a;
      const q = sw ? a : b;
      const pts = rectIntersectionPolygon(cx[p], cy[p], c[p], s[p], hx[p], hy[p], cx[q], cy[q], c[q], s[q], hx[q], hy[q]);
      const d = rectSatDepth(cx[p], cy[p], c[p], s[p], hx[p], hy[p], cx[q], cy[q], c[q], s[q], hx[q], hy[q]);
      const message = `${partName(input, p)} overlaps ${partName(input, q)} by ${fmtMm(d)} mm`;
      return pairDraft(input, kind, severity, a, b, sw, message, polyOrPoint(pts, cx[p], cy[p]), d, null);
    }
    case K_COURTYARD: {
      const p = sw ? b : a;
      const q = sw ? a : b;
      const gp = g[p];
      const gq = g[q];
      const pts = rectIntersectionPolygon(
        cx[p], cy[p], c[p], s[p], hx[p] + gp, hy[p] + gp,
        cx[q], cy[q], c[q], s[q], hx[q] + gq, hy[q] + gq,
      );
      const d = rectSatDepth(
        cx[p], cy[p], c[p], s[p], hx[p] + gp, hy[p] + gp,
        cx[q], cy[q], c[q], s[q], hx[q] + gq, hy[q] + gq,
      );
      rectCorners(cx[p], cy[p], c[p], s[p], hx[p], hy[p], quadA);
      rectCorners(cx[q], cy[q], c[q], s[q], hx[q], hy[q], quadB);
      const gap = hx[p] * hy[p] > 0 && hx[q] * hy[q] > 0 ? convexGap(quadA, 4, quadB, 4) : pointGap(P, p, q);
      const gapText = gap <= 1e-6 ? 'the bodies touch' : `bodies ${fmtMm(gap)} mm apart`;
      const message = `Courtyards of ${partName(input, p)} and ${partName(input, q)} overlap by ${fmtMm(d)} mm (${gapText})`;
      return pairDraft(input, kind, severity, a, b, sw, message, polyOrPoint(pts, cx[p], cy[p]), d, gap <= 1e-6 ? 0 : gap);
    }
    case K_OFF_BOARD:
    case K_OVERHANG: {
      const tail = raw === K_OVERHANG ? ' (its package is marked overhang)' : '';
      return singleDraft(input, kind, severity, a, `${partName(input, a)} reaches ${fmtMm(depth)} mm outside its board${tail}`, bodyGeometry(P, a), depth, null);
    }
    case K_FIDUCIAL: {
      const f = input.fiducials[sink.aux[k]];
      const near = nearestPointOnRect(f.x, f.y, cx[a], cy[a], c[a], s[a], hx[a], hy[a]);
      return singleDraft(
        input, kind, severity, a,
        `${partName(input, a)} enters the clear area of fiducial ${f.name}: its body is ${fmtMm(dist)} mm from the fiducial's centre, ${fmtMm(depth)} mm inside the ${fmtMm(f.clearRadius)} mm clear radius`,
        { type: 'segment', from: [f.x, f.y], to: near },
        depth, dist, f.name,
      );
    }
    case K_SHADOW: {
      // a = the part being placed, b = the taller neighbour
      const near = nearestPointOnRect(cx[a], cy[a], cx[b], cy[b], c[b], s[b], hx[b], hy[b]);
      const message = `${tallName(input, P, b)} is ${fmtMm(dist)} mm from the centre of ${tallName(input, P, a)}, within its nozzle holder radius of ${fmtMm(P.R[a])} mm: place ${input.ref[a]} first`;
      return pairDraft(input, kind, severity, a, b, sw, message, { type: 'segment', from: [cx[a], cy[a]], to: near }, depth, dist);
    }
    case K_REACH: {
      const r = input.reach!;
      return singleDraft(
        input, kind, severity, a,
        `${partName(input, a)} at (${fmtMm(cx[a])}, ${fmtMm(cy[a])}) is ${fmtMm(depth)} mm outside the machine reach (${fmtMm(r.x)} × ${fmtMm(r.y)} mm)`,
        { type: 'point', x: cx[a], y: cy[a] },
        depth, null,
      );
    }
    case K_NO_PACKAGE: {
      const fp = input.footprint?.[a];
      const what = fp ? `footprint "${fp}"` : 'its footprint';
      return singleDraft(input, kind, severity, a, `${partName(input, a)}: ${what} matches no package in the library`, { type: 'point', x: cx[a], y: cy[a] }, null, null);
    }
    case K_NO_NOZZLE: {
      const pk = input.packageName?.[a];
      const what = pk ? `package ${pk}` : 'its package';
      return singleDraft(input, kind, severity, a, `${partName(input, a)}: none of the nozzles of ${what} is on the machine`, { type: 'point', x: cx[a], y: cy[a] }, null, null);
    }
    case K_NOZZLE_SIZE: {
      const nz = input.nozzle?.[a];
      const tip = input.tipOuter![a];
      const small = Math.min(input.length[a], input.width[a]);
      const what = nz ? `nozzle ${nz}` : 'its nozzle';
      return singleDraft(input, kind, severity, a, `${partName(input, a)}: the tip of ${what} (⌀ ${fmtMm(tip)} mm) is wider than the body's smaller side (${fmtMm(small)} mm)`, { type: 'point', x: cx[a], y: cy[a] }, sink.depth[k], null);
    }
    case K_BOARD_OVERLAP: {
      const side = SIDE_NAMES[sink.aux[k]];
      const qa = O.boardCorners.subarray(8 * a, 8 * a + 8);
      const qb = O.boardCorners.subarray(8 * b, 8 * b + 8);
      const nums = [input.boards[a].board, input.boards[b].board].sort((x, y) => x - y);
      const pts = convexIntersectionPolygon(qa, 4, qb, 4);
      return boardDraft(kind, severity, side, nums, `Board ${nums[0]} and board ${nums[1]} overlap by ${fmtMm(depth)} mm`, polyOrPoint(pts, qa[0], qa[1]), depth);
    }
    case K_OFF_PANEL: {
      const side = SIDE_NAMES[sink.aux[k]];
      const num = input.boards[a].board;
      return boardDraft(kind, severity, side, [num], `Board ${num} reaches ${fmtMm(depth)} mm outside the panel`, polygonOf(O.boardCorners.subarray(8 * a, 8 * a + 8), 4), depth);
    }
    case K_PANEL_REACH: {
      const side = SIDE_NAMES[sink.aux[k]];
      const q = O.panelCorners.subarray(8 * a, 8 * a + 8);
      const r = input.reach!;
      const pw = Math.hypot(q[2] - q[0], q[3] - q[1]);
      const ph = Math.hypot(q[6] - q[0], q[7] - q[1]);
      const reachText = `the machine reach (${fmtMm(r.x)} × ${fmtMm(r.y)} mm)`;
      // the panel's own X edge (corner 0 → 1) against the reach in X, its Y edge against Y
      const larger = pw > r.x + 1e-6 || ph > r.y + 1e-6;
      const message = larger
        ? `The panel (${fmtMm(pw)} × ${fmtMm(ph)} mm) is larger than ${reachText}`
        : `The panel reaches ${fmtMm(depth)} mm outside ${reachText}`;
      return boardDraft(kind, severity, side, [], message, polygonOf(q, 4), depth);
    }
    default:
      throw new Error(`unknown finding record kind ${raw}`);
  }
}

function boardDraft(
  kind: FindingKind, severity: 'error' | 'warning', side: 'top' | 'bottom', boards: number[],
  message: string, geometry: FindingGeometry, depth: number,
): Draft {
  return {
    key: findingKey(kind, [], boards),
    kind,
    severity,
    side,
    board: boards.length ? boards[0] : null,
    boards,
    refs: [],
    message,
    geometry,
    depth,
    distance: null,
  };
}

function polygonOf(q: ArrayLike<number>, n: number): FindingGeometry {
  const points: [number, number][] = [];
  for (let i = 0; i < n; i++) points.push([q[2 * i], q[2 * i + 1]]);
  return { type: 'polygon', points };
}

function polyOrPoint(pts: [number, number][], x: number, y: number): FindingGeometry {
  if (pts.length >= 3) return { type: 'polygon', points: pts };
  if (pts.length > 0) return { type: 'point', x: pts[0][0], y: pts[0][1] };
  return { type: 'point', x, y };
}

