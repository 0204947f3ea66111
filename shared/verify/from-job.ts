// Adapter: the pipeline's run results (shared/pipeline, one per side) → the findings engine's
// own input (VerifyInput). Pure.
//
// - Body: centre = the run's x, y (placement point + turned body offset), turned by the output
//   rotation; L × W from the package. A part without a package becomes a point body with no
//   courtyard (it cannot overlap anything; it is reported as no-package).
// - A part without a nozzle gets holder radius 0 (no shadow test for it; reported as no-nozzle)
//   and tip diameter 0 (no nozzle-size test).
// - Do-not-place parts are not in a run's placements, so they are never checked.
// - Skipped boards place nothing and are left out of the board layout checks.
import type { Quad, RunResult } from '../core';
import {
  SIDE_BOTTOM,
  SIDE_TOP,
  type BoardOutline,
  type PanelOutline,
  type QuadCorners,
  type VerifyFiducial,
  type VerifyInput,
} from './types';

const corners = (q: Quad): QuadCorners => [q[0].x, q[0].y, q[1].x, q[1].y, q[2].x, q[2].y, q[3].x, q[3].y];

const num = (v: number): number => (Number.isNaN(v) ? 0 : v);

/** One VerifyInput from the runs of one or both sides of the same job. */
export function verifyInputFromRuns(runs: RunResult[]): VerifyInput {
  const sides = new Set<string>();
  for (const r of runs) {
    if (sides.has(r.side)) throw new Error(`verifyInputFromRuns: two runs for the ${r.side} side`);
    sides.add(r.side);
  }
  const n = runs.reduce((a, r) => a + r.placements.count, 0);
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
    tipOuter: new Float64Array(n),
    nozzle: new Array(n),
    overhang: new Uint8Array(n),
    hasPackage: new Uint8Array(n),
    hasNozzle: new Uint8Array(n),
    footprint: new Array(n),
    packageName: new Array(n),
    boards: [],
    panels: [],
    fiducials: [],
    reach: null,
  };
  let at = 0;
  for (const r of runs) {
    const p = r.placements;
    const sideCode = r.side === 'bottom' ? SIDE_BOTTOM : SIDE_TOP;
    input.board.set(p.board, at);
    input.side.fill(sideCode, at, at + p.count);
    input.cx.set(p.x, at);
    input.cy.set(p.y, at);
    input.angleDeg.set(p.rotation, at);
    input.overhang.set(p.overhang, at);
    for (let i = 0; i < p.count; i++) {
      const k = at + i;
      input.ref[k] = p.ref[i];
      input.footprint![k] = p.footprint[i];
      const pkg = p.packageName[i];
      input.packageName![k] = pkg;
      const matched = pkg !== null && !Number.isNaN(p.bodyLength[i]);
      input.hasPackage[k] = matched ? 1 : 0;
      input.hasNozzle[k] = p.nozzle[i] !== null ? 1 : 0;
      input.length[k] = matched ? num(p.bodyLength[i]) : 0;
      input.width[k] = matched ? num(p.bodyWidth[i]) : 0;
      input.height[k] = matched ? num(p.bodyHeight[i]) : 0;
      input.courtyard[k] = matched ? num(p.courtyard[i]) : 0;
      input.holderRadius[k] = p.nozzle[i] !== null ? num(p.holderRadius[i]) : 0;
      input.tipOuter![k] = p.nozzle[i] !== null ? num(p.nozzleTip[i]) : 0;
      input.nozzle![k] = p.nozzle[i];
    }
    at += p.count;
    for (const b of r.boards) {
      if (b.skipped) continue;
      const outline: BoardOutline = { board: b.number, side: r.side, corners: corners(b.outline) };
      input.boards.push(outline);
    }
    const panel: PanelOutline = { side: r.side, corners: corners(r.panel.outline) };
    input.panels.push(panel);
    for (const f of r.fiducials) {
      const fid: VerifyFiducial = { name: f.name, side: f.side, x: f.x, y: f.y, clearRadius: f.clearRadius };
      input.fiducials.push(fid);
    }
    if (r.machine && !input.reach) input.reach = { x: r.machine.reachX, y: r.machine.reachY };
  }
  return input;
}
