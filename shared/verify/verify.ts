// The findings engine's entry (see README.md here). Pure: no node: imports, no I/O, so it runs
// in a worker thread on the server, in the CLI and in the browser.
//
// Method: per side, a static spatial index (flatbush) over every body's bounding box grown by its
// own courtyard, built in the cell order of a grid bucketing (planQueries). Overlaps: neighbouring
// parts (a bucket of about GROUP_SIZE) share one index query over the union of their grown boxes;
// each pair whose boxes meet is taken up once and gets the exact separating-axis test on the
// turned rectangles (penetration depth, then the common area by convex clipping) for courtyards
// and bodies. Nozzle shadow: only parts taller than the lowest nozzle part by more than 0.5 mm can
// cast one, so they query (planShadowQueries) for the parts whose centre lies within reach, then
// the point-to-turned-rectangle distance. Fiducial clear circles are index queries too;
// containment in the board quad and the reach are per part. Hot loops run on typed arrays with
// fields in locals; the index hands back indices, not objects; findings go to a compact
// typed-array store (sink.ts) and become objects at the end (report.ts).
//
// `verifyBruteForce` runs the same exact tests on every pair (for the bench and the tests).
//
// Files: validate.ts (input checks), prepare.ts (derived arrays, outlines, the index), plan.ts
// (broad phase), pairs.ts (exact pair tests), single.ts (one part or outline at a time), sink.ts
// (compact store), report.ts (finding objects). This file runs them in order.

import { pairsBrute, pairsIndexed } from './pairs';
import { planQueries } from './plan';
import { buildTree, prepare, prepareOutlines } from './prepare';
import { buildReport } from './report';
import { FindingSink, verifyProbe } from './sink';
import { fiducialChecks, panelChecks, singleChecks } from './single';
import { SIDE_NAMES, type VerifyInput, type VerifyOptions, type VerifyResult } from './types';
import { validateShape, VerifyInputError } from './validate';

export const DEFAULT_LIMIT = 10_000;

export { verifyProbe } from './sink';
export { VerifyInputError, validateInput } from './validate';
export { prepare, prepareOutlines, buildTree, NODE_SIZE, type Prepared, type PreparedOutlines } from './prepare';
export { planQueries, planShadowQueries, GROUP_SIZE, SHADOW_HEIGHT_STEP, type QueryPlan, type ShadowPlan } from './plan';

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** Check a job's placements and outlines; findings sorted (errors first, then by kind, board and
 * reference). */
export function verify(input: VerifyInput, options: VerifyOptions = {}): VerifyResult {
  return run(input, options, false);
}

/** The same check with every pair of same-side parts tested exactly (no index): O(n²). */
export function verifyBruteForce(input: VerifyInput, options: VerifyOptions = {}): VerifyResult {
  return run(input, options, true);
}

function run(input: VerifyInput, options: VerifyOptions, brute: boolean): VerifyResult {
  const t0 = now();
  validateShape(input);
  const limit = options.limit ?? DEFAULT_LIMIT;
  if (!Number.isInteger(limit) || limit < 0) {
    throw new VerifyInputError(`limit must be a whole number ≥ 0, got ${limit}`);
  }
  const sides = sidesOf(options.sides ?? 'both');
  const P = prepare(input);
  const O = prepareOutlines(input);
  const sink = new FindingSink(limit);
  const probe = verifyProbe.onPhase;
  if (probe) probe('prepare');

  let placements = 0;
  let panelDone = false;
  for (const side of sides) {
    const ids = P.sideIds[side];
    placements += ids.length;
    // the indexed run works in the plan's cell order (neighbours next to each other)
    const plan = brute || ids.length === 0 ? null : planQueries(P, ids);
    const tree = plan ? buildTree(P, plan.ids) : null;
    if (probe) probe('index');
    if (plan && tree) pairsIndexed(P, plan, tree, sink);
    else pairsBrute(P, ids, sink);
    if (probe) probe('pairs');
    fiducialChecks(input, P, plan ? plan.ids : ids, side, tree, sink);
    singleChecks(input, P, O, ids, side, sink);
    // the panel layout is the same on both sides: check it once, on the first side that has it
    if (!panelDone && (O.panelBySide[side] >= 0 || hasBoards(input, side))) {
      panelChecks(input, O, side, sink);
      panelDone = true;
    }
  }
  const result = buildReport(input, P, O, sink, limit, placements, t0, now);
  if (probe) probe('report');
  return result;
}

function sidesOf(choice: string): number[] {
  if (choice === 'top') return [0];
  if (choice === 'bottom') return [1];
  if (choice === 'both') return [0, 1];
  throw new VerifyInputError(`sides must be top, bottom or both, got "${choice}"`);
}

function hasBoards(input: VerifyInput, side: number): boolean {
  const name = SIDE_NAMES[side];
  return input.boards.some((b) => b.side === name);
}
