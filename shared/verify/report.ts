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
} from './geom';
import { compareBoardRefs, compareRefs } from './natural';
import {
  FindingSink,
  K_BODY,
  K_BOARD_OVERLAP,
  K_COURTYARD,
  K_FIDUCIAL,
  K_NO_NOZZLE,
  K_NO_PACKAGE,
  K_OFF_BOARD,
  K_OFF_PANEL,
  K_OVERHANG,
  K_PANEL_REACH,
  K_REACH,
  K_SHADOW,
  RAW_KINDS,
} from './sink';
import { SIDE_NAMES, type VerifyInput, type VerifyResult } from './types';
import type { Prepared, PreparedOutlines } from './verify';

/** Public kind and severity of each raw record kind. */
const RAW: { kind: FindingKind; severity: 'error' | 'warning' }[] = [];
RAW[K_BODY] = { kind: 'body-overlap', severity: 'error' };
RAW[K_COURTYARD] = { kind: 'courtyard-overlap', severity: 'warning' };
RAW[K_OFF_BOARD] = { kind: 'off-board', severity: 'error' };
RAW[K_OVERHANG] = { kind: 'off-board', severity: 'warning' };
RAW[K_BOARD_OVERLAP] = { kind: 'board-overlap', severity: 'error' };
RAW[K_OFF_PANEL] = { kind: 'off-panel', severity: 'error' };
RAW[K_FIDUCIAL] = { kind: 'fiducial-clearance', severity: 'error' };
RAW[K_SHADOW] = { kind: 'nozzle-shadow', severity: 'warning' };
RAW[K_REACH] = { kind: 'out-of-reach', severity: 'error' };
RAW[K_PANEL_REACH] = { kind: 'out-of-reach', severity: 'error' };
RAW[K_NO_PACKAGE] = { kind: 'no-package', severity: 'error' };
RAW[K_NO_NOZZLE] = { kind: 'no-nozzle', severity: 'error' };

const KIND_RANK = new Map<FindingKind, number>(FINDING_KINDS.map((k, i) => [k, i]));

/** Millimetres for a message: two decimals, more for tiny values ("0.21", "0.0042"). */
export function fmtMm(v: number): string {
  const a = Math.abs(v);
  if (a === 0) return '0';
  if (a >= 0.01) return v.toFixed(2);
  return Number(v.toPrecision(2)).toString();
}

/** The stable key of a finding: kind plus its sorted refs, or its boards for panel kinds. */
export function findingKey(kind: FindingKind, refs: string[], boards: number[]): string {
  if (refs.length > 0) return `${kind}|${refs.join('|')}`;
  if (boards.length > 0) return `${kind}|boards:${boards.join(',')}`;
  return `${kind}|panel`;
}

interface Draft {
  finding: Finding;
  /** (board, ref) pairs in order, for sorting */
  parts: [number, string][];
}

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
  const drafts: Draft[] = [];
  const seen = new Set<string>();
  for (let k = 0; k < sink.size; k++) {
    const d = draft(input, P, O, sink, k);
    if (seen.has(d.finding.key)) continue;
    seen.add(d.finding.key);
    drafts.push(d);
  }
  drafts.sort(compareDrafts);
  const byKind = Object.fromEntries(FINDING_KINDS.map((k) => [k, 0])) as Record<FindingKind, number>;
  let errors = 0;
  let warnings = 0;
  let truncated = false;
  for (let r = 0; r < RAW_KINDS; r++) {
    const n = sink.found[r];
    if (n === 0) continue;
    byKind[RAW[r].kind] += n;
    if (RAW[r].severity === 'error') errors += n;
    else warnings += n;
    if (n > sink.kept[r]) truncated = true;
  }
  if (drafts.length > limit) {
    truncated = true;
    drafts.length = limit;
  }
  return {
    findings: drafts.map((d) => d.finding),
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

function compareDrafts(a: Draft, b: Draft): number {
  const fa = a.finding;
  const fb = b.finding;
  if (fa.severity !== fb.severity) return fa.severity === 'error' ? -1 : 1;
  const ka = KIND_RANK.get(fa.kind)! - KIND_RANK.get(fb.kind)!;
  if (ka !== 0) return ka;
  const n = Math.min(a.parts.length, b.parts.length);
  for (let i = 0; i < n; i++) {
    const c = compareBoardRefs(a.parts[i][0], a.parts[i][1], b.parts[i][0], b.parts[i][1]);
    if (c !== 0) return c;
  }
  if (a.parts.length !== b.parts.length) return a.parts.length - b.parts.length;
  return fa.key < fb.key ? -1 : fa.key > fb.key ? 1 : 0;
}

function draft(input: VerifyInput, P: Prepared, O: PreparedOutlines, sink: FindingSink, k: number): Draft {
  const raw = sink.kind[k];
  const { kind, severity } = RAW[raw];
  const a = sink.a[k];
  const b = sink.b[k];
  const depth = sink.depth[k];
  const dist = sink.dist[k];
  const { cx, cy, c, s, hx, hy, g } = P;
  const ref = input.ref;
  const board = input.board;
  const name = (i: number): string => `${ref[i]} on board ${board[i]}`;
  const pos = (i: number): string => `(${cx[i].toFixed(2)}, ${cy[i].toFixed(2)})`;
  const sideOfPart = (i: number) => SIDE_NAMES[input.side[i]];

  const single = (i: number, message: string, geometry: FindingGeometry, dp: number | null, ds: number | null, extra: Partial<Finding> = {}): Draft => {
    const refs = [`${board[i]}:${ref[i]}`];
    return {
      finding: {
        key: findingKey(kind, refs, []),
        kind,
        severity,
        side: sideOfPart(i),
        board: board[i],
        boards: [board[i]],
        refs,
        message,
        geometry,
        depth: dp,
        distance: ds,
        ...extra,
      },
      parts: [[board[i], ref[i]]],
    };
  };

  const pair = (i: number, j: number, message: (first: number, second: number) => string, geometry: FindingGeometry, dp: number | null, ds: number | null, ordered = false): Draft => {
    // sorted by board then natural reference; `ordered` keeps the message's (part, neighbour) roles
    let first = i;
    let second = j;
    if (compareBoardRefs(board[j], ref[j], board[i], ref[i]) < 0) {
      first = j;
      second = i;
    }
    const refs = [`${board[first]}:${ref[first]}`, `${board[second]}:${ref[second]}`];
    const boards = board[first] === board[second] ? [board[first]] : [board[first], board[second]].sort((x, y) => x - y);
    return {
      finding: {
        key: findingKey(kind, refs, []),
        kind,
        severity,
        side: sideOfPart(i),
        board: board[first],
        boards,
        refs,
        message: ordered ? message(i, j) : message(first, second),
        geometry,
        depth: dp,
        distance: ds,
      },
      parts: [[board[first], ref[first]], [board[second], ref[second]]],
    };
  };

  const bodyPolygon = (i: number): FindingGeometry => {
    if (hx[i] === 0 && hy[i] === 0) return { type: 'point', x: cx[i], y: cy[i] };
    const q = new Float64Array(8);
    rectCorners(cx[i], cy[i], c[i], s[i], hx[i], hy[i], q);
    return polygonOf(q, 4);
  };

  switch (raw) {
    case K_BODY: {
      const pts = rectIntersectionPolygon(cx[a], cy[a], c[a], s[a], hx[a], hy[a], cx[b], cy[b], c[b], s[b], hx[b], hy[b]);
      return pair(a, b, (p, q) => `${name(p)} overlaps ${name(q)} by ${fmtMm(depth)} mm`, polyOrPoint(pts, cx[a], cy[a]), depth, null);
    }
    case K_COURTYARD: {
      const pts = rectIntersectionPolygon(
        cx[a], cy[a], c[a], s[a], hx[a] + g[a], hy[a] + g[a],
        cx[b], cy[b], c[b], s[b], hx[b] + g[b], hy[b] + g[b],
      );
      const qa = new Float64Array(8);
      const qb = new Float64Array(8);
      rectCorners(cx[a], cy[a], c[a], s[a], hx[a], hy[a], qa);
      rectCorners(cx[b], cy[b], c[b], s[b], hx[b], hy[b], qb);
      const gap = convexGap(qa, 4, qb, 4);
      const gapText = gap <= 1e-6 ? 'the bodies touch' : `bodies ${fmtMm(gap)} mm apart`;
      return pair(
        a, b,
        (p, q) => `Courtyards of ${name(p)} and ${name(q)} overlap by ${fmtMm(depth)} mm (${gapText})`,
        polyOrPoint(pts, cx[a], cy[a]), depth, gap <= 1e-6 ? 0 : gap,
      );
    }
    case K_OFF_BOARD:
    case K_OVERHANG: {
      const tail = raw === K_OVERHANG ? ' (its package is marked overhang)' : '';
      return single(a, `${name(a)} reaches ${fmtMm(depth)} mm outside its board${tail}`, bodyPolygon(a), depth, null);
    }
    case K_FIDUCIAL: {
      const f = input.fiducials[sink.aux[k]];
      const near = nearestPointOnRect(f.x, f.y, cx[a], cy[a], c[a], s[a], hx[a], hy[a]);
      return single(
        a,
        `${name(a)} enters the clear area of fiducial ${f.name}: its body is ${fmtMm(dist)} mm from the fiducial's centre, ${fmtMm(depth)} mm inside the ${fmtMm(f.clearRadius)} mm clear radius`,
        { type: 'segment', from: [f.x, f.y], to: near },
        depth, dist, { fiducial: f.name },
      );
    }
    case K_SHADOW: {
      // a = the part placed, b = the taller neighbour
      const near = nearestPointOnRect(cx[a], cy[a], cx[b], cy[b], c[b], s[b], hx[b], hy[b]);
      return pair(
        a, b,
        (p, q) =>
          `${name(q)} (${fmtMm(P.h[q])} mm tall) is ${fmtMm(dist)} mm from the centre of ${name(p)} (${fmtMm(P.h[p])} mm tall), within its nozzle holder radius of ${fmtMm(P.R[p])} mm: place ${ref[p]} first`,
        { type: 'segment', from: [cx[a], cy[a]], to: near },
        depth, dist, true,
      );
    }
    case K_REACH: {
      const r = input.reach!;
      return single(
        a,
        `${name(a)} at ${pos(a)} is ${fmtMm(depth)} mm outside the machine reach (${fmtMm(r.x)} × ${fmtMm(r.y)} mm)`,
        { type: 'point', x: cx[a], y: cy[a] },
        depth, null,
      );
    }
    case K_NO_PACKAGE: {
      const fp = input.footprint?.[a];
      const what = fp ? `footprint "${fp}"` : 'its footprint';
      return single(a, `${name(a)}: ${what} matches no package in the library`, { type: 'point', x: cx[a], y: cy[a] }, null, null);
    }
    case K_NO_NOZZLE: {
      const pk = input.packageName?.[a];
      const what = pk ? `package ${pk}` : 'its package';
      return single(a, `${name(a)}: none of the nozzles of ${what} is on the machine`, { type: 'point', x: cx[a], y: cy[a] }, null, null);
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
      const larger = Math.max(pw, ph) > Math.max(r.x, r.y) + 1e-6 || Math.min(pw, ph) > Math.min(r.x, r.y) + 1e-6;
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
    finding: {
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
    },
    // panel findings sort by board number (as if board:"" refs)
    parts: boards.map((n) => [n, ''] as [number, string]),
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

export { compareRefs };
