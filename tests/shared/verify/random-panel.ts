// Seeded random panels for the verify tests and bench: boards filled at a realistic density
// (a jittered 2.2 mm cell grid, mostly passive chips, some ICs, a few tall parts), stepped out
// in a grid with every other board turned 180°, board-local fiducials in three corners.
import type { BoardOutline, VerifyFiducial, VerifyInput } from '../../../shared/verify';
import { mulberry32 } from '../../helpers/prng';


interface Pkg {
  name: string;
  L: number;
  W: number;
  H: number;
  holder: number;
  weight: number;
}

// body sizes after shared/README.md, "Check values and their sources" (chips, SOT-23, SOIC-8); the tall parts are invented
const PACKAGES: Pkg[] = [
  { name: 'C0402', L: 1.0, W: 0.5, H: 0.35, holder: 2.5, weight: 38 },
  { name: 'C0603', L: 1.6, W: 0.8, H: 0.45, holder: 2.5, weight: 24 },
  { name: 'C0805', L: 2.0, W: 1.25, H: 0.6, holder: 2.5, weight: 10 },
  { name: 'SOT-23', L: 2.9, W: 1.3, H: 1.0, holder: 3.5, weight: 12 },
  { name: 'SOIC-8', L: 4.9, W: 3.9, H: 1.5, holder: 3.5, weight: 8 },
  { name: 'CAP-6.3', L: 6.6, W: 6.6, H: 5.4, holder: 5.0, weight: 3 },
  { name: 'HDR-2x5', L: 12.7, W: 5.1, H: 8.5, holder: 5.0, weight: 2 },
];
const TOTAL_WEIGHT = PACKAGES.reduce((a, p) => a + p.weight, 0);

export interface RandomPanelOptions {
  placements: number;
  seed?: number;
  /** parts per board (default 500) */
  perBoard?: number;
  /** fraction of parts pushed off their cell (makes some findings) */
  jitterFraction?: number;
  /** fraction of parts at an arbitrary angle (default 0.05) */
  oddAngleFraction?: number;
}

const CELL = 2.2;
const COURTYARD = 0.25;

/** A random panel of exactly `placements` parts (top side). */
export function randomPanel(opts: RandomPanelOptions): VerifyInput {
  const rnd = mulberry32(opts.seed ?? 1);
  const n = opts.placements;
  const perBoard = Math.min(opts.perBoard ?? 500, n);
  const jitterFraction = opts.jitterFraction ?? 0.004;
  const oddAngle = opts.oddAngleFraction ?? 0.05;
  const boardsNeeded = Math.ceil(n / perBoard);
  // a board of about perBoard / 0.75 cells, 4:3
  const cells = Math.ceil(perBoard / 0.72) + 24;
  const cols = Math.ceil(Math.sqrt((cells * 4) / 3));
  const rows = Math.ceil(cells / cols);
  const BW = cols * CELL + 4;
  const BH = rows * CELL + 4;
  const gridCols = Math.ceil(Math.sqrt(boardsNeeded));
  const pitchX = BW + 2;
  const pitchY = BH + 2;

  const input: VerifyInput = {
    count: n,
    ref: new Array(n),
    board: new Int32Array(n),
    side: new Uint8Array(n),
    cx: new Float64Array(n),
    cy: new Float64Array(n),
    angleDeg: new Float64Array(n),
    length: new Float64Array(n),
    width: new Float64Array(n),
    height: new Float64Array(n),
    courtyard: new Float64Array(n),
    holderRadius: new Float64Array(n),
    overhang: new Uint8Array(n),
    hasPackage: new Uint8Array(n).fill(1),
    hasNozzle: new Uint8Array(n).fill(1),
    boards: [],
    panels: [],
    fiducials: [],
    reach: null,
  };

  // one board layout, stepped out (as a real panel is)
  type Local = { x: number; y: number; a: number; p: Pkg; ref: string };
  const layout: Local[] = [];
  const used = new Uint8Array(cols * rows);
  // fiducial corners stay clear (3 × 3 cells)
  const reserve = (c0: number, r0: number) => {
    for (let r = r0; r < r0 + 3; r++) for (let c = c0; c < c0 + 3; c++) used[r * cols + c] = 1;
  };
  reserve(0, 0);
  reserve(cols - 3, 0);
  reserve(0, rows - 3);
  const counters = new Map<string, number>();
  let guard = 0;
  while (layout.length < perBoard && guard++ < perBoard * 200) {
    let w = rnd() * TOTAL_WEIGHT;
    let p = PACKAGES[0];
    for (const q of PACKAGES) {
      if ((w -= q.weight) <= 0) {
        p = q;
        break;
      }
    }
    const turn = rnd() < 0.5 ? 0 : 90;
    const odd = rnd() < oddAngle;
    // footprint in cells (an odd angle needs the diagonal)
    const span = odd ? Math.hypot(p.L, p.W) : 0;
    const ex = odd ? span : turn === 0 ? p.L : p.W;
    const ey = odd ? span : turn === 0 ? p.W : p.L;
    // tall parts keep a cell of room around them (as a layout would, for hands and nozzles)
    const ring = p.H > 3 ? 2 * CELL : 0;
    const cw = Math.ceil((ex + 2 * COURTYARD + 0.1 + ring) / CELL);
    const ch = Math.ceil((ey + 2 * COURTYARD + 0.1 + ring) / CELL);
    const c0 = Math.floor(rnd() * (cols - cw + 1));
    const r0 = Math.floor(rnd() * (rows - ch + 1));
    let free = true;
    for (let r = r0; r < r0 + ch && free; r++) for (let c = c0; c < c0 + cw; c++) if (used[r * cols + c]) { free = false; break; }
    if (!free) continue;
    for (let r = r0; r < r0 + ch; r++) for (let c = c0; c < c0 + cw; c++) used[r * cols + c] = 1;
    const slackX = cw * CELL - ex - 2 * COURTYARD - ring;
    const slackY = ch * CELL - ey - 2 * COURTYARD - ring;
    let x = 2 + (c0 + cw / 2) * CELL + (rnd() - 0.5) * slackX * 0.8;
    let y = 2 + (r0 + ch / 2) * CELL + (rnd() - 0.5) * slackY * 0.8;
    if (rnd() < jitterFraction) {
      x += (rnd() - 0.5) * 3;
      y += (rnd() - 0.5) * 3;
    }
    const a = odd ? rnd() * 360 : turn + (rnd() < 0.5 ? 0 : 180);
    const prefix = p.name.startsWith('C0') ? 'C' : p.name.startsWith('SOT') ? 'Q' : p.name.startsWith('SOIC') ? 'U' : p.name.startsWith('CAP') ? 'C' : 'J';
    const num = (counters.get(prefix) ?? 0) + 1;
    counters.set(prefix, num);
    layout.push({ x, y, a, p, ref: `${prefix}${num}` });
  }
  if (layout.length < perBoard) throw new Error(`could only fit ${layout.length} of ${perBoard} parts on a board`);

  const fidLocal: [number, number][] = [
    [2 + 1.5 * CELL, 2 + 1.5 * CELL],
    [2 + (cols - 1.5) * CELL, 2 + 1.5 * CELL],
    [2 + 1.5 * CELL, 2 + (rows - 1.5) * CELL],
  ];
  let i = 0;
  for (let b = 0; b < boardsNeeded; b++) {
    const col = b % gridCols;
    const row = Math.floor(b / gridCols);
    const ax = 5 + col * pitchX;
    const ay = 5 + row * pitchY;
    const turned = (row + col) % 2 === 1;
    const toPanel = (u: number, v: number): [number, number] => (turned ? [ax + BW - u, ay + BH - v] : [ax + u, ay + v]);
    const boardNo = b + 1;
    const outline: BoardOutline = { board: boardNo, side: 'top', corners: [ax, ay, ax + BW, ay, ax + BW, ay + BH, ax, ay + BH] };
    input.boards.push(outline);
    fidLocal.forEach(([u, v], k) => {
      const [x, y] = toPanel(u, v);
      const f: VerifyFiducial = { name: `B${boardNo}F${k + 1}`, side: 'top', x, y, clearRadius: 1.0 };
      input.fiducials.push(f);
    });
    for (let k = 0; k < layout.length && i < n; k++, i++) {
      const l = layout[k];
      const [x, y] = toPanel(l.x, l.y);
      input.ref[i] = l.ref;
      input.board[i] = boardNo;
      input.cx[i] = x;
      input.cy[i] = y;
      input.angleDeg[i] = turned ? (l.a + 180) % 360 : l.a;
      input.length[i] = l.p.L;
      input.width[i] = l.p.W;
      input.height[i] = l.p.H;
      input.courtyard[i] = COURTYARD;
      input.holderRadius[i] = l.p.holder;
    }
  }
  const PW = 10 + gridCols * pitchX;
  const PH = 10 + Math.ceil(boardsNeeded / gridCols) * pitchY;
  input.panels.push({ side: 'top', corners: [0, 0, PW, 0, PW, PH, 0, PH] });
  input.reach = { x: PW + 10, y: PH + 10 };
  return input;
}
