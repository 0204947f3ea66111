// A seeded synthetic panel for the canvas benchmark: 5 × 5 boards of 78 × 78 mm, 2,000 parts
// each (50,000 on a 414 × 414 mm panel, about 33 parts per cm², the density of a dense modern
// board; the bench machine reaches 420 mm), a package mix dominated by 0402 and 0603 chips, rotations in quarter turns with a few
// odd angles. Parts are placed by rejection sampling on an occupancy grid so that bodies mostly
// keep apart, as on a real board; the few that find no free spot overlap (findings to draw).
import { allocatePlacementColumns } from '../../../shared/core';
import type { BoardInstanceResult, Quad, RunResult } from '../../../shared/core';
import { mulberry32 } from '../../helpers/prng';


// [package, L, W, H, weight, nozzle]
const MIX: [string, number, number, number, number, string][] = [
  ['R0201', 0.6, 0.3, 0.25, 20, 'N05'],
  ['C0201', 0.6, 0.3, 0.3, 18, 'N05'],
  ['R0402', 1.0, 0.5, 0.35, 15, 'N05'],
  ['C0402', 1.0, 0.5, 0.5, 15, 'N05'],
  ['C0603', 1.6, 0.8, 0.8, 8, 'N07'],
  ['R0603', 1.6, 0.8, 0.45, 4, 'N07'],
  ['C0805', 2.0, 1.25, 1.25, 5, 'N10'],
  ['SOT-23', 2.9, 1.3, 1.0, 5, 'N10'],
  ['SOD-123', 2.7, 1.6, 1.1, 3, 'N10'],
  ['SOIC-8', 4.9, 3.9, 1.75, 0.5, 'N14'],
  ['QFN-32-5x5', 5, 5, 0.9, 0.5, 'N14'],
  ['TQFP-48-7x7', 7, 7, 1.2, 0.2, 'N25'],
  ['IND-4x4', 4, 4, 2, 0.5, 'N25'],
];
const TOTAL_W = MIX.reduce((a, m) => a + m[4], 0);

export const BOARD_W = 78, BOARD_H = 78, COLS = 5, ROWS = 5, PER_BOARD = 2000;
export const PITCH_X = 80, PITCH_Y = 80, OFFSET = 8;

export function syntheticRun(seed = 20261202, partsPerBoard = PER_BOARD): RunResult {
  const rnd = mulberry32(seed);
  const n = COLS * ROWS * partsPerBoard;
  const p = allocatePlacementColumns(n);
  const PW = OFFSET * 2 + (COLS - 1) * PITCH_X + BOARD_W;
  const PH = OFFSET * 2 + (ROWS - 1) * PITCH_Y + BOARD_H;
  // one board design, stepped out (as a real panel is): parts at the same board positions
  const CELL = 0.1;
  const gw = Math.ceil(BOARD_W / CELL), gh = Math.ceil(BOARD_H / CELL);
  const occupied = new Uint8Array(gw * gh);
  const cells = (u: number, v: number, hx: number, hy: number) => [
    Math.max(0, Math.floor((u - hx) / CELL)), Math.max(0, Math.floor((v - hy) / CELL)),
    Math.min(gw - 1, Math.floor((u + hx) / CELL)), Math.min(gh - 1, Math.floor((v + hy) / CELL)),
  ];
  const free = (c: number[]) => {
    for (let y = c[1]; y <= c[3]; y++) for (let x = c[0]; x <= c[2]; x++) if (occupied[y * gw + x]) return false;
    return true;
  };
  // larger parts first, as a designer places them
  const picks = Array.from({ length: partsPerBoard }, () => {
    let r = rnd() * TOTAL_W;
    for (const x of MIX) if ((r -= x[4]) <= 0) return x;
    return MIX[0];
  }).sort((a, b) => b[1] * b[2] - a[1] * a[2]);
  const design = picks.map((m, k) => {
    const rot = rnd() < 0.05 ? rnd() * 360 : Math.floor(rnd() * 4) * 90;
    const c = Math.abs(Math.cos((rot * Math.PI) / 180)), sn = Math.abs(Math.sin((rot * Math.PI) / 180));
    const hx = (m[1] * c + m[2] * sn) / 2 + 0.1, hy = (m[1] * sn + m[2] * c) / 2 + 0.1;
    let u = 0, v = 0, box: number[] = [];
    for (let t = 0; t < 100; t++) {
      u = 1 + hx + rnd() * (BOARD_W - 2 - 2 * hx);
      v = 1 + hy + rnd() * (BOARD_H - 2 - 2 * hy);
      box = cells(u, v, hx, hy);
      if (free(box)) break;
    }
    for (let y = box[1]; y <= box[3]; y++) for (let x = box[0]; x <= box[2]; x++) occupied[y * gw + x] = 1;
    const prefix = m[0][0] === 'R' ? 'R' : m[0][0] === 'C' ? 'C' : m[0].startsWith('IND') ? 'L' : m[0].startsWith('SOD') ? 'D' : 'U';
    return { ref: `${prefix}${k + 1}`, m, u, v, rot };
  });
  const boards: BoardInstanceResult[] = [];
  let i = 0;
  for (let row = 0; row < ROWS; row++) {
    for (let col = 0; col < COLS; col++) {
      const number = row * COLS + col + 1;
      const ax = OFFSET + col * PITCH_X, ay = OFFSET + row * PITCH_Y;
      const outline: Quad = [{ x: ax, y: ay }, { x: ax + BOARD_W, y: ay }, { x: ax + BOARD_W, y: ay + BOARD_H }, { x: ax, y: ay + BOARD_H }];
      boards.push({ number, anchor: { x: ax, y: ay }, rotation: 0, skipped: false, row, col, outline, localTransform: false });
      for (const d of design) {
        p.seq[i] = i + 1;
        p.board[i] = number;
        p.ref[i] = d.ref;
        p.x[i] = p.originX[i] = ax + d.u;
        p.y[i] = p.originY[i] = ay + d.v;
        p.rotation[i] = d.rot;
        p.packageName[i] = d.m[0];
        p.footprint[i] = d.m[0];
        p.nozzle[i] = d.m[5];
        p.vision[i] = 'chip-small';
        p.bodyLength[i] = d.m[1];
        p.bodyWidth[i] = d.m[2];
        p.bodyHeight[i] = d.m[3];
        p.courtyard[i] = 0.1; // IPC-7351B density level C (from memory)
        p.holderRadius[i] = 1;
        p.value[i] = '10k';
        p.partNumber[i] = 'HCI-BENCH';
        p.sourceIndex[i] = i % partsPerBoard;
        i++;
      }
    }
  }
  return {
    side: 'top',
    frame: 'panel',
    program: 'bench',
    revision: 'A',
    placements: p,
    boards,
    boardsPlaced: boards.length,
    board: { width: BOARD_W, height: BOARD_H, originX: 0, originY: 0 },
    panel: { width: PW, height: PH, outline: [{ x: 0, y: 0 }, { x: PW, y: 0 }, { x: PW, y: PH }, { x: 0, y: PH }], flipAxis: 'vertical' },
    fiducials: [
      { name: 'PT1', side: 'top', frame: 'panel', x: 4, y: 4, panelX: 4, panelY: 4, measured: null, clearRadius: 1 },
      { name: 'PT2', side: 'top', frame: 'panel', x: PW - 4, y: 4, panelX: PW - 4, panelY: 4, measured: null, clearRadius: 1 },
      { name: 'PT3', side: 'top', frame: 'panel', x: 4, y: PH - 4, panelX: 4, panelY: PH - 4, measured: null, clearRadius: 1 },
    ],
    transform: null,
    boardTransforms: [],
    unmatched: [],
    machine: { name: 'bench', reachX: 420, reachY: 420, nozzles: ['N05', 'N07', 'N10', 'N14', 'N25'] },
    import: { placements: [], columns: {}, units: 'mm', warnings: [], dialect: { delimiter: ',', decimalComma: false, headerLine: 1, bom: false, lineEnding: '\n', unitsSource: 'option', dnpSense: null }, headers: [] },
    warnings: [],
  };
}

/** The same panel with nothing on it but its outline: the floor of the benchmark. */
export function outlineOnly(run: RunResult): RunResult {
  return { ...run, placements: allocatePlacementColumns(0), boards: [], boardsPlaced: 0, fiducials: [], machine: null };
}
