// Bench of the findings engine (shared/verify). Exports run(); prints nothing itself.
//
// - checkVsIndexFloor: whole check time ÷ (computing the boxes, building the flatbush index and
//   running the same bounding-box queries — one per group of neighbouring parts, as the check
//   makes them — with nothing done with the candidates), 100,000 placements. Target ≤ 2.5.
// - checkVsBruteForce: brute-force all-pairs time (same exact tests on every pair) ÷ check time,
//   5,000 placements. Target ≥ 50.
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

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

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

function timeIt(fn: () => unknown, runs: number): number[] {
  const out: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t = now();
    fn();
    out.push(now() - t);
  }
  return out;
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
  const big = randomPanel({ placements: 100_000, seed: 20261202 });
  const small = randomPanel({ placements: 5_000, seed: 5150 });

  // warm-up (JIT) on the small panel
  for (let r = 0; r < 3; r++) {
    verify(small);
    indexFloor(small);
  }
  verifyBruteForce(randomPanel({ placements: 600, seed: 7 }));

  // 100,000: check vs index floor (interleaved, median of 5)
  const checkMs: number[] = [];
  const floorMs: number[] = [];
  let findings = 0;
  let errors = 0;
  let warnings = 0;
  for (let r = 0; r < 5; r++) {
    floorMs.push(...timeIt(() => indexFloor(big), 1));
    const t = now();
    const res = verify(big);
    checkMs.push(now() - t);
    findings = res.findings.length;
    errors = res.summary.errors;
    warnings = res.summary.warnings;
  }
  const check100k = median(checkMs);
  const floor100k = median(floorMs);

  // 5,000: brute force vs check
  const check5kRuns = timeIt(() => verify(small), 9);
  const brute5kRuns = timeIt(() => verifyBruteForce(small), 3);
  const check5k = median(check5kRuns);
  const brute5k = median(brute5kRuns);
  const same =
    JSON.stringify(verify(small).findings.map((f) => f.key)) ===
    JSON.stringify(verifyBruteForce(small).findings.map((f) => f.key));

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
  return {
    verifyPlacements: big.count,
    verifyFindings100k: findings,
    verifyErrors100k: errors,
    verifyWarnings100k: warnings,
    verifyCheckMs100k: r3(check100k),
    verifyIndexFloorMs100k: r3(floor100k),
    checkVsIndexFloor: r3(check100k / floor100k),
    verifyCheckMs5k: r3(check5k),
    verifyBruteForceMs5k: r3(brute5k),
    checkVsBruteForce: r3(brute5k / check5k),
    verifyBruteForceSameFindings5k: same,
    verifyHeapMB: r3(peak / 1048576),
    verifyHeapMeasure: `heapUsed + arrayBuffers over the settled baseline, sampled at every phase end (work arrays released first${gc ? ', gc before' : ', no gc available'})`,
  };
}
