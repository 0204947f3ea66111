// Engine benchmarks (`npm run bench`). Seeded data so runs compare like for like. Prints nothing on
// stdout itself: figures are returned to tests/bench/run.ts; progress goes to stderr.
import Papa from 'papaparse';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { importCentroid } from '../../shared/centroid';
import { runJob } from '../../shared/pipeline';
import { writePlacementListCsv } from '../../shared/placement-list';
import { jobSchema } from '../../shared/schemas/job.schema';
import { libraryFileSchema } from '../../shared/schemas/library-file.schema';
import { mulberry32 } from '../helpers/prng';


const FOOTPRINTS = ['R0402', 'C0402', 'R0603', 'C0603', 'SOT23', 'SOIC8', 'QFN32-5x5'];

function centroidCsv(rows: number, seed: number): string {
  const rnd = mulberry32(seed);
  const out = ['Ref,Val,Package,PosX,PosY,Rot,Side'];
  for (let i = 0; i < rows; i++) {
    out.push(
      `P${i + 1},10k,${FOOTPRINTS[i % FOOTPRINTS.length]},${(rnd() * 200).toFixed(3)},${(rnd() * 150).toFixed(3)},${[0, 90, 180, 270][i & 3]},${rnd() < 0.7 ? 'top' : 'bottom'}`,
    );
  }
  return out.join('\n') + '\n';
}

/** Wall and CPU time of one measurement, ms: the best (minimum) of the runs of each. On a shared
 * machine the minimum is the least disturbed measurement, and CPU time (process.cpuUsage: user +
 * system of all this process's threads, GC helpers included) does not count time spent waiting
 * for a core that another process holds. The same rule for each subject and its floor; garbage
 * collection that a run triggers is part of its time. */
interface Timing {
  wall: number;
  cpu: number;
}

let gc: () => void = () => {};

/** Full GC, a pause for the concurrent sweeper to release array buffers, and another GC. */
async function settle(): Promise<void> {
  gc();
  await new Promise((r) => setTimeout(r, 50));
  gc();
}

function cpuNow(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

function once(fn: () => unknown): Timing {
  const c0 = cpuNow();
  const t0 = performance.now();
  fn();
  const t1 = performance.now();
  const c1 = cpuNow();
  return { wall: t1 - t0, cpu: c1 - c0 };
}

async function onceAsync(fn: () => Promise<unknown>): Promise<Timing> {
  const c0 = cpuNow();
  const t0 = performance.now();
  await fn();
  const t1 = performance.now();
  const c1 = cpuNow();
  return { wall: t1 - t0, cpu: c1 - c0 };
}

const bestOf = (ts: Timing[]): Timing => ({ wall: Math.min(...ts.map((t) => t.wall)), cpu: Math.min(...ts.map((t) => t.cpu)) });
const med = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1];
/** medians of the last timePair series, by name (reported beside the best-of figures) */
const medians: Record<string, { subjectCpu: number; floorCpu: number }> = {};

/** A subject and its floor, `runs` calls each after a warm-up, interleaved (so both see the same
 * load on a shared machine). One full GC before the series, none between calls: a forced full GC
 * invalidates freshly optimised code that holds weak references (V8 "weak objects" deopt), which
 * would measure the JIT's recompilation instead of the engine. */
async function timePair(
  subject: () => unknown,
  floor: () => unknown,
  runs: number,
  name = '',
): Promise<[Timing, Timing]> {
  // warm-up: a few calls each, so that the engine's optimising compiler has settled
  for (let i = 0; i < 5; i++) {
    await subject();
    await floor();
  }
  gc();
  const a: Timing[] = [];
  const b: Timing[] = [];
  for (let i = 0; i < runs; i++) {
    a.push(await onceAsync(async () => subject()));
    b.push(await onceAsync(async () => floor()));
  }
  if (name) medians[name] = { subjectCpu: med(a.map((t) => t.cpu)), floorCpu: med(b.map((t) => t.cpu)) };
  return [bestOf(a), bestOf(b)];
}

function time(fn: () => unknown, runs: number): Timing {
  for (let i = 0; i < 5; i++) fn();
  gc();
  const ts: Timing[] = [];
  for (let i = 0; i < runs; i++) ts.push(once(fn));
  return bestOf(ts);
}

const log = (s: string) => process.stderr.write(`[engine.bench] ${s}\n`);
const r2 = (v: number) => Math.round(v * 100) / 100;
const fmt = (t: Timing) => `${t.wall.toFixed(2)} ms wall / ${t.cpu.toFixed(2)} ms cpu`;
/** the ratio of two timings: by CPU time (robust on a shared machine), and by wall time */
const ratio = (a: Timing, b: Timing) => ({ cpu: r2(a.cpu / b.cpu), wall: r2(a.wall / b.wall) });

export async function run(): Promise<Record<string, unknown>> {
  setFlagsFromString('--expose-gc');
  gc = runInNewContext('gc') as () => void;

  // ---- import of a 50,000-row CSV vs papaparse alone on the same text --------------------------
  const text = centroidCsv(50_000, 1);
  const [importMs, papaMs] = await timePair(() => importCentroid(text, { units: 'mm' }), () => Papa.parse(text), 21, 'import');
  // for reference: papaparse told the delimiter and line ending (as the importer tells it after
  // sniffing the header), i.e. without its own guessing
  const papaToldMs = time(() => Papa.parse(text, { delimiter: ',', newline: '\n' }), 21);
  log(`import ${fmt(importMs)}, papaparse ${fmt(papaMs)}, papaparse told the dialect ${fmt(papaToldMs)}`);

  // ---- panelize + align of 100,000 placements vs a bare typed-array affine loop ---------------
  // 2,000 top parts on a 100 × 80 board, 50-up panel (5 × 10, alternate columns turned 180°),
  // four measured panel fiducials (affine fit), a library matching every footprint
  const rnd = mulberry32(2);
  const partsCsv = ['Ref,Val,Package,PosX,PosY,Rot,Side'];
  for (let i = 0; i < 2000; i++) partsCsv.push(`P${i + 1},1k,${FOOTPRINTS[i % FOOTPRINTS.length]},${(rnd() * 100).toFixed(3)},${(rnd() * 80).toFixed(3)},${(i * 90) % 360},top`);
  const imported = importCentroid(partsCsv.join('\n'), { units: 'mm' });
  const cellRotations = [];
  for (let row = 0; row < 10; row++) for (const col of [1, 3]) cellRotations.push({ row, col, rotation: 180 });
  const job = jobSchema.parse({
    centroid: 'bench.csv',
    board: { width: 100, height: 80 },
    panel: { width: 540, height: 860, grid: { rows: 10, cols: 5, pitchX: 105, pitchY: 85, offsetX: 10, offsetY: 10, cellRotations } },
    fiducials: [
      { name: 'F1', side: 'top', frame: 'panel', x: 4, y: 4, measured: { x: 104.1, y: 54.2 } },
      { name: 'F2', side: 'top', frame: 'panel', x: 536, y: 4, measured: { x: 636.0, y: 55.3 } },
      { name: 'F3', side: 'top', frame: 'panel', x: 4, y: 856, measured: { x: 102.4, y: 906.0 } },
      { name: 'F4', side: 'top', frame: 'panel', x: 300, y: 857, measured: { x: 398.5, y: 907.5 } },
    ],
    machine: { reachX: 1000, reachY: 1000, nozzles: ['N07', 'N14', 'N25'] },
    library: 'lib.json',
  });
  const library = libraryFileSchema.parse({
    format: 'placewright-library/1',
    packages: [
      { name: 'R0402', body: { length: 1, width: 0.5, height: 0.35 }, nozzles: ['N07'] },
      { name: 'C0402', body: { length: 1, width: 0.5, height: 0.5 }, nozzles: ['N07'] },
      { name: 'R0603', body: { length: 1.6, width: 0.8, height: 0.45 }, nozzles: ['N07'] },
      { name: 'C0603', body: { length: 1.6, width: 0.8, height: 0.8 }, nozzles: ['N07'] },
      { name: 'SOT-23', aliases: ['SOT23'], body: { length: 2.9, width: 1.3, height: 1 }, rotationOffset: -90, nozzles: ['N07'] },
      { name: 'SOIC-8', aliases: ['SOIC8*'], body: { length: 4.9, width: 3.9, height: 1.75 }, nozzles: ['N14'] },
      { name: 'QFN-32', aliases: ['QFN32*'], body: { length: 5, width: 5, height: 0.9, offsetX: 0.1 }, nozzles: ['N25'] },
    ],
    nozzles: [{ name: 'N07', tipOuter: 0.7, holderRadius: 2.5 }, { name: 'N14', tipOuter: 1.4, holderRadius: 3.5 }, { name: 'N25', tipOuter: 2.5, holderRadius: 4.5 }],
  });
  const panelize = () => runJob({ job, imported, library, side: 'top' });
  const result = panelize();
  const n = result.placements.count;
  if (n !== 100_000) throw new Error(`bench: expected 100,000 placements, got ${n}`);

  // floor: the bare step-out + transform over typed arrays, no strings, no lookups
  const u = new Float64Array(2000), v = new Float64Array(2000), th = new Float64Array(2000);
  const table = imported.table!; // (reading imported.placements would hand runJob records instead)
  u.set(table.x);
  v.set(table.y);
  th.set(table.rotation);
  // the floor returns new arrays, as any step-out that hands back its results must
  const floor = () => {
    const X = new Float64Array(n), Y = new Float64Array(n), R = new Float64Array(n);
    let k = 0;
    for (let b = 0; b < 50; b++) {
      const phi = b & 1 ? 180 : 0;
      const a = 1.0001, bb = -0.002, c = 0.002, d = 1.0001, tx = 100 + b, ty = 50 + b;
      for (let j = 0; j < 2000; j++, k++) {
        X[k] = a * u[j] + bb * v[j] + tx;
        Y[k] = c * u[j] + d * v[j] + ty;
        let r = (th[j] + phi) % 360;
        if (r < 0) r += 360;
        R[k] = r;
      }
    }
    return { X, Y, R };
  };
  const [panelizeMs, floorMs] = await timePair(panelize, floor, 31, 'panelize');
  log(`panelize+align ${fmt(panelizeMs)}, floor ${fmt(floorMs)}`);

  // the same with every derived column read once (what a consumer that reads everything pays)
  const COLS = ['seq', 'board', 'ref', 'side', 'originX', 'originY', 'packageName', 'nozzle', 'vision', 'bodyLength', 'bodyWidth', 'bodyHeight', 'courtyard', 'overhang', 'holderRadius', 'partNumber', 'value', 'footprint', 'sourceIndex'] as const;
  const readAll = (r: ReturnType<typeof panelize>) => {
    let s = 0;
    for (const c of COLS) s += (r.placements[c] as ArrayLike<unknown>).length;
    return s;
  };
  const panelizeAllMs = time(() => readAll(panelize()), 15);
  log(`panelize+align, every column read ${fmt(panelizeAllMs)}`);

  // retained memory of one 100,000-placement result (JS heap + typed-array backing stores)
  await settle();
  const m0 = process.memoryUsage();
  let held: unknown = panelize();
  await settle();
  const m1 = process.memoryUsage();
  const heapMB = (m1.heapUsed - m0.heapUsed + (m1.arrayBuffers - m0.arrayBuffers)) / (1024 * 1024);
  readAll(held as ReturnType<typeof panelize>);
  await settle();
  const m2 = process.memoryUsage();
  const heapAllMB = (m2.heapUsed - m0.heapUsed + (m2.arrayBuffers - m0.arrayBuffers)) / (1024 * 1024);
  held = null;
  void held;

  // ---- neutral CSV of 100,000 placements vs a join of toFixed(3) -----------------------------
  const p = result.placements;
  const [writeMs, writeFloorMs] = await timePair(
    () => writePlacementListCsv(result, { generated: '2026-03-11T09:00:00Z' }),
    () => {
      const lines = new Array<string>(n);
      for (let i = 0; i < n; i++) lines[i] = p.x[i].toFixed(3) + ',' + p.y[i].toFixed(3) + ',' + p.rotation[i].toFixed(3);
      return lines.join('\n');
    },
    9,
    'write',
  );
  log(`write ${fmt(writeMs)}, toFixed floor ${fmt(writeFloorMs)}`);

  const imp = ratio(importMs, papaMs);
  const pan = ratio(panelizeMs, floorMs);
  const wr = ratio(writeMs, writeFloorMs);
  return {
    importVsParse: imp.cpu,
    importVsParseWall: imp.wall,
    importMs: r2(importMs.wall),
    importCpuMs: r2(importMs.cpu),
    papaparseMs: r2(papaMs.wall),
    papaparseCpuMs: r2(papaMs.cpu),
    importVsParseToldDialect: r2(importMs.cpu / papaToldMs.cpu),
    papaparseToldDialectMs: r2(papaToldMs.wall),
    panelizeVsFloor: pan.cpu,
    panelizeVsFloorWall: pan.wall,
    panelizeMs: r2(panelizeMs.wall),
    panelizeCpuMs: r2(panelizeMs.cpu),
    panelizeFloorMs: r2(floorMs.wall),
    panelizeFloorCpuMs: r2(floorMs.cpu),
    panelizeHeapMB: r2(heapMB),
    panelizeAllColumnsVsFloor: r2(panelizeAllMs.cpu / floorMs.cpu),
    panelizeAllColumnsMs: r2(panelizeAllMs.wall),
    panelizeAllColumnsCpuMs: r2(panelizeAllMs.cpu),
    panelizeAllColumnsHeapMB: r2(heapAllMB),
    writeVsFloor: wr.cpu,
    writeVsFloorWall: wr.wall,
    writeMs: r2(writeMs.wall),
    writeCpuMs: r2(writeMs.cpu),
    writeFloorMs: r2(writeFloorMs.wall),
    writeFloorCpuMs: r2(writeFloorMs.cpu),
    importVsParseMedian: r2(medians.import.subjectCpu / medians.import.floorCpu),
    panelizeVsFloorMedian: r2(medians.panelize.subjectCpu / medians.panelize.floorCpu),
    writeVsFloorMedian: r2(medians.write.subjectCpu / medians.write.floorCpu),
    engineTiming: 'subject and floor interleaved, best of 9-31 runs each after 5 warm-up calls and one full GC (none between runs); ratios by process CPU time, *Wall by wall time, *Median the ratio of CPU-time medians',
  };
}
