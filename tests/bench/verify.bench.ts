// Bench of the findings engine (shared/verify). Exports run(); prints nothing itself.
//
// - checkVsIndexFloor: whole check time ÷ (computing the boxes, building the flatbush index and
//   running the same bounding-box queries — one per group of neighbouring parts, as the check
//   makes them — with nothing done with the candidates), 100,000 placements. Target ≤ 2.5.
// - checkVsBruteForce: brute-force all-pairs time (same exact tests on every pair) ÷ check time,
//   5,000 placements. Target ≥ 50.
// Headline times are the fastest wall-clock run of each (interleaved runs), the figure least
// disturbed by other jobs on the shared 2-core machine; medians of wall clock and of process CPU
// time are reported beside them.
// - verifyHeapMB: peak extra memory (JS heap + array buffers) during a 100,000-placement check,
//   sampled at every phase end and after the run. Target < 200.
// Panels are seeded (tests/shared/verify/random-panel.ts) so runs compare like for like.
import vm from 'node:vm';
import v8 from 'node:v8';
import {
  buildTree,
  planQueries,
  planShadowQueries,
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

const min = (xs: number[]): number => Math.min(...xs);

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
 * per group of neighbouring parts for overlaps, see planQueries, and one per group holding parts
 * tall enough to shadow a neighbour, see planShadowQueries), with nothing done with the
 * candidates. */
function indexFloor(input: VerifyInput): number {
  const P = prepare(input);
  let hits = 0;
  for (const ids of P.sideIds) {
    if (ids.length === 0) continue;
    const plan = planQueries(P, ids);
    const tree = buildTree(P, plan.ids);
    if (!tree) continue;
    const b = plan.box;
    for (let g = 0; g < plan.groups; g++) hits += tree.search(b[4 * g], b[4 * g + 1], b[4 * g + 2], b[4 * g + 3]).length;
    const shadows = planShadowQueries(P, plan);
    const q = shadows.box;
    for (let t = 0; t < shadows.queries; t++) hits += tree.search(q[4 * t], q[4 * t + 1], q[4 * t + 2], q[4 * t + 3]).length;
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
  // warm-up: the optimizing compiler settles after some 12–15 runs
  for (let r = 0; r < 20; r++) {
    verify(small);
    indexFloor(small);
  }
  const warm = randomPanel({ placements: 600, seed: 7 });
  for (let r = 0; r < 3; r++) verifyBruteForce(warm);
  const check5k = times();
  const brute5k = times();
  // the same number of runs of each, interleaved
  for (let r = 0; r < 7; r++) {
    timeInto(brute5k, () => verifyBruteForce(small));
    for (let q = 0; q < 3; q++) timeInto(check5k, () => verify(small));
  }
  const same =
    JSON.stringify(verify(small).findings.map((f) => f.key)) ===
    JSON.stringify(verifyBruteForce(small).findings.map((f) => f.key));

  // 100,000: check vs index floor (interleaved, median of 7)
  const big = randomPanel({ placements: 100_000, seed: 20261202 });
  for (let r = 0; r < 2; r++) {
    verify(big);
    indexFloor(big);
  }
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
  const med = (t: Times, k: keyof Times) => median(t[k]);
  const lo = (t: Times) => min(t.wall);
  return {
    verifyPlacements: big.count,
    verifyFindings100k: findings,
    verifyErrors100k: errors,
    verifyWarnings100k: warnings,
    // headline ratios from the fastest wall-clock run of each (the run least disturbed by other
    // jobs on a shared machine); medians of wall clock and of CPU time beside them
    checkVsIndexFloor: r3(lo(check100k) / lo(floor100k)),
    checkVsBruteForce: r3(lo(brute5k) / lo(check5k)),
    verifyHeapMB: r3(peak / 1048576),
    verifyCheckMs100k: r3(lo(check100k)),
    verifyIndexFloorMs100k: r3(lo(floor100k)),
    verifyCheckMs5k: r3(lo(check5k)),
    verifyBruteForceMs5k: r3(lo(brute5k)),
    checkVsIndexFloorMedianWall: r3(med(check100k, 'wall') / med(floor100k, 'wall')),
    checkVsBruteForceMedianWall: r3(med(brute5k, 'wall') / med(check5k, 'wall')),
    checkVsIndexFloorMedianCpu: r3(med(check100k, 'cpu') / med(floor100k, 'cpu')),
    checkVsBruteForceMedianCpu: r3(med(brute5k, 'cpu') / med(check5k, 'cpu')),
    verifyMedianWallMs: {
      check100k: r3(med(check100k, 'wall')),
      floor100k: r3(med(floor100k, 'wall')),
      check5k: r3(med(check5k, 'wall')),
      brute5k: r3(med(brute5k, 'wall')),
    },
    verifyBruteForceSameFindings5k: same,
    verifyHeapMeasure: `heapUsed + arrayBuffers over the settled baseline, sampled at every phase end (work arrays released first${gc ? ', gc before' : ', no gc available'})`,
    verifyTimeMeasure: 'ms wall clock, fastest of interleaved runs (7 floor/check at 100k; 7 brute/21 check at 5k); medians of wall and of process CPU time (user + system, all threads) beside them',
  };
}
