// Bench of the findings engine (shared/verify). Exports run(); prints nothing itself.
//
// - checkVsIndexFloor: whole check time ÷ (computing the boxes, building the flatbush index and
//   running the same bounding-box queries — one per group of neighbouring parts, as the check
//   makes them — with nothing done with the candidates), 100,000 placements. Target ≤ 2.5.
// - checkVsBruteForce: brute-force all-pairs time (same exact tests on every pair) ÷ check time,
//   5,000 placements. Target ≥ 50.
// Times are process CPU time (medians of interleaved runs), steadier than the wall clock on the
// shared 2-core machine; the wall-clock figures are reported beside them.
// - verifyHeapMB: peak extra memory (JS heap + array buffers) during a 100,000-placement check,
//   sampled at every phase end and after the run. Target < 200.
// Panels are seeded (tests/shared/verify/random-panel.ts) so runs compare like for like.
import vm from 'node:vm';
import v8 from 'node:v8';
import {
  buildTree,
  planQueries,
  prepare,
  verify,
  verifyBruteForce,
  verifyProbe,
} from '../../shared/verify/verify';
import type { VerifyInput } from '../../shared/verify/types';
import { releaseVerifyScratch } from '../../shared/verify/scratch';
import { randomPanel } from '../shared/verify/random-panel';

const now = () => performance.now();
/** CPU time of this process, ms (user + system): steadier than the wall clock on a machine shared
 * with other jobs. */
const cpu = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

interface Times {
  wall: number[];
  cpu: number[];
}

function timeInto(t: Times, fn: () => unknown): unknown {
  const w = now();
  const c = cpu();
  const out = fn();
  t.cpu.push(cpu() - c);
  t.wall.push(now() - w);
  return out;
}

const times = (): Times => ({ wall: [], cpu: [] });

/** The floor: the part boxes, the index, and the same bounding-box queries the check makes (one
 * per group of neighbouring parts, see planQueries), with nothing done with the candidates. */
function indexFloor(input: VerifyInput): number {
  const P = prepare(input);
  let hits = 0;
  for (const ids of P.sideIds) {
    const tree = buildTree(P, ids);
    if (!tree) continue;
    const plan = planQueries(P, ids);
    const b = plan.box;
    for (let g = 0; g < plan.groups; g++) hits += tree.search(b[4 * g], b[4 * g + 1], b[4 * g + 2], b[4 * g + 3]).length;
  }
  return hits;
}

function getGc(): (() => void) | null {
  const g = (globalThis as { gc?: () => void }).gc;
  if (typeof g === 'function') return g;
  try {
    v8.setFlagsFromString('--expose-gc');
    return vm.runInNewContext('gc') as () => void;
  } catch {
    return null;
  }
}

const mem = () => {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
};

export async function run(): Promise<Record<string, unknown>> {
  // 5,000 first, on a small heap: brute force vs check (each measured as a whole, median)
  const small = randomPanel({ placements: 5_000, seed: 5150 });
  for (let r = 0; r < 5; r++) {
    verify(small);
    indexFloor(small);
  }
  verifyBruteForce(randomPanel({ placements: 600, seed: 7 }));
  const check5k = times();
  const brute5k = times();
  for (let r = 0; r < 25; r++) timeInto(check5k, () => verify(small));
  for (let r = 0; r < 3; r++) timeInto(brute5k, () => verifyBruteForce(small));
  const same =
    JSON.stringify(verify(small).findings.map((f) => f.key)) ===
    JSON.stringify(verifyBruteForce(small).findings.map((f) => f.key));

  // 100,000: check vs index floor (interleaved, median of 7)
  const big = randomPanel({ placements: 100_000, seed: 20261202 });
  verify(big);
  indexFloor(big);
  const check100k = times();
  const floor100k = times();
  let findings = 0;
  let errors = 0;
  let warnings = 0;
  for (let r = 0; r < 7; r++) {
    timeInto(floor100k, () => indexFloor(big));
    const res = timeInto(check100k, () => verify(big)) as ReturnType<typeof verify>;
    findings = res.findings.length;
    errors = res.summary.errors;
    warnings = res.summary.warnings;
  }

  // peak extra memory of one 100,000 check
  const gc = getGc();
  // array buffers are freed after a collection, on a later tick: collect, wait, collect, wait
  const settle = async () => {
    for (let r = 0; r < 2; r++) {
      if (gc) gc();
      await new Promise((res) => setTimeout(res, 30));
    }
  };
  releaseVerifyScratch();
  await settle();
  const base = mem();
  let peak = 0;
  verifyProbe.onPhase = () => {
    const d = mem() - base;
    if (d > peak) peak = d;
  };
  let result: unknown = verify(big);
  verifyProbe.onPhase = null;
  peak = Math.max(peak, mem() - base);
  result = null;
  void result;

  const r3 = (x: number) => Math.round(x * 1000) / 1000;
  const m = (t: Times, k: keyof Times) => median(t[k]);
  return {
    verifyPlacements: big.count,
    verifyFindings100k: findings,
    verifyErrors100k: errors,
    verifyWarnings100k: warnings,
    // headline ratios from CPU time (medians); wall-clock figures beside them
    checkVsIndexFloor: r3(m(check100k, 'cpu') / m(floor100k, 'cpu')),
    checkVsBruteForce: r3(m(brute5k, 'cpu') / m(check5k, 'cpu')),
    verifyHeapMB: r3(peak / 1048576),
    verifyCheckMs100k: r3(m(check100k, 'cpu')),
    verifyIndexFloorMs100k: r3(m(floor100k, 'cpu')),
    verifyCheckMs5k: r3(m(check5k, 'cpu')),
    verifyBruteForceMs5k: r3(m(brute5k, 'cpu')),
    verifyWallCheckMs100k: r3(m(check100k, 'wall')),
    verifyWallIndexFloorMs100k: r3(m(floor100k, 'wall')),
    verifyWallCheckMs5k: r3(m(check5k, 'wall')),
    verifyWallBruteForceMs5k: r3(m(brute5k, 'wall')),
    checkVsIndexFloorWall: r3(m(check100k, 'wall') / m(floor100k, 'wall')),
    checkVsBruteForceWall: r3(m(brute5k, 'wall') / m(check5k, 'wall')),
    verifyBruteForceSameFindings5k: same,
    verifyHeapMeasure: `heapUsed + arrayBuffers over the settled baseline, sampled at every phase end (work arrays released first${gc ? ', gc before' : ', no gc available'})`,
    verifyTimeMeasure: 'ms of process CPU time (user + system), median of interleaved runs; *Wall* = wall clock',
  };
}
