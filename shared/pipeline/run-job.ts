// One engine run: import → panel → fiducials → library → output-frame placements (one side).
import { importCentroid, placementsToTable } from '../centroid';
import { applyAffine, composeAffine, mapRect, type Affine } from '../geometry';
import { fitTransform, transformToAffine } from '../fiducials';
import { Assigner, DEFAULT_COURTYARD } from '../library';
import { boardInstances, designToSidePanel, sideAffine, sideRotationTerm } from '../panel';
import type { Job } from '../schemas/job.schema';
import type { LibraryFile } from '../schemas/library-file.schema';
import { EngineInputError } from '../core';
import { allocatePlacementColumns, defineLazyColumns } from '../core';
import type {
  BoardInstanceResult,
  PlacementColumns,
  BoardTransform,
  EngineWarning,
  FiducialUsed,
  ImportResult,
  Quad,
  RunResult,
  Side,
  TransformResult,
  UnmatchedFootprint,
  XY,
} from '../core';

export interface RunJobInput {
  /** the parsed job (jobSchema output) */
  job: Job;
  /** the centroid file's text (ignored when `imported` is given) */
  centroidText?: string;
  /** an import already done (e.g. after the user corrected the column mapping) */
  imported?: ImportResult;
  /** the parsed library file, or null */
  library: LibraryFile | null;
  side: Side;
  /** names for error messages */
  jobFile?: string;
  centroidFile?: string;
  /** units given on the command line: override the job's import.units */
  unitsOverride?: ImportResult['units'];
}

const quad = (pts: XY[]): Quad => [pts[0], pts[1], pts[2], pts[3]];

/** Run the engine for one side of the job's panel. Pure and synchronous. Throws EngineInputError. */
export function runJob(input: RunJobInput): RunResult {
  const { job, library, side, jobFile } = input;
  const warnings: EngineWarning[] = [];

  const imported =
    input.imported ??
    importCentroid(input.centroidText ?? '', {
      file: input.centroidFile ?? job.centroid,
      units: input.unitsOverride ?? job.import.units,
      unitsSource: input.unitsOverride ? 'option' : job.import.units ? 'job' : undefined,
      bottomRotation: job.import.bottomRotation,
      map: job.import.map,
    });
  warnings.push(...imported.warnings);

  const board = job.board;
  const panel = job.panel;
  const PW = panel.width;
  const PH = panel.height;
  const flipAxis = panel.flipAxis;
  const instances = boardInstances(panel, jobFile);
  const byNumber = new Map(instances.map((b) => [b.number, b]));
  const S = sideAffine(side, flipAxis, PW, PH);
  const boardMaps = new Map<number, Affine>();
  for (const inst of instances) {
    boardMaps.set(inst.number, designToSidePanel(inst, board, side, flipAxis, PW, PH));
  }
  // board-frame → side panel frame = designToSidePanel ∘ (board → design)
  const boardToPanel = (n: number): Affine =>
    composeAffine(boardMaps.get(n)!, { a: 1, b: 0, c: 0, d: 1, tx: board.originX, ty: board.originY });

  // ---- fiducials of this side --------------------------------------------------------------
  const names = new Set<string>();
  type Fid = { name: string; frame: 'panel' | 'board'; board?: number; p: XY; measured: XY | null; clearRadius: number };
  const fids: Fid[] = [];
  job.fiducials.forEach((f, i) => {
    if (f.side !== side) return;
    if (names.has(f.name)) {
      throw new EngineInputError(`duplicate fiducial name "${f.name}" on the ${side} side`, { file: jobFile, field: `fiducials[${i}].name`, code: 'duplicate-fiducial' });
    }
    names.add(f.name);
    if (f.frame === 'panel') {
      fids.push({ name: f.name, frame: 'panel', p: applyAffine(S, f.x, f.y), measured: f.measured ?? null, clearRadius: f.clearRadius });
    } else {
      for (const key of Object.keys(f.measured ?? {})) {
        const inst = byNumber.get(Number(key));
        if (!inst) throw new EngineInputError(`no board ${key} in the panel (${instances.length} boards)`, { file: jobFile, field: `fiducials[${i}].measured.${key}`, code: 'bad-board' });
        if (inst.skipped) throw new EngineInputError(`board ${key} is skipped; it has no fiducials to measure`, { file: jobFile, field: `fiducials[${i}].measured.${key}`, code: 'bad-board' });
      }
      for (const inst of instances) {
        if (inst.skipped) continue;
        fids.push({
          name: `${f.name}@${inst.number}`,
          frame: 'board',
          board: inst.number,
          p: applyAffine(boardToPanel(inst.number), f.x, f.y),
          measured: f.measured?.[String(inst.number)] ?? null,
          clearRadius: f.clearRadius,
        });
      }
    }
  });

  const limits = job.limits;
  const panelMeasured = fids.filter((f) => f.frame === 'panel' && f.measured);
  let transform: TransformResult | null = null;
  if (panelMeasured.length > 0) {
    transform = fitTransform(panelMeasured.map((f) => f.p), panelMeasured.map((f) => f.measured!), job.transform, {
      names: panelMeasured.map((f) => f.name),
      limits,
      context: `${side} panel fiducials`,
      file: jobFile,
    });
    warnings.push(...transform.warnings);
  }
  const boardTransforms: BoardTransform[] = [];
  const localAffine = new Map<number, Affine>();
  for (const inst of instances) {
    if (inst.skipped) continue;
    const local = fids.filter((f) => f.board === inst.number && f.measured);
    if (local.length < 2) continue;
    const t = fitTransform(local.map((f) => f.p), local.map((f) => f.measured!), job.transform, {
      names: local.map((f) => f.name),
      limits,
      context: `board ${inst.number} local fiducials`,
      file: jobFile,
    });
    warnings.push(...t.warnings);
    boardTransforms.push({ board: inst.number, transform: t });
    localAffine.set(inst.number, transformToAffine(t));
  }
  const placedBoards = instances.filter((b) => !b.skipped);
  if (!transform && boardTransforms.length > 0 && boardTransforms.length < placedBoards.length) {
    const missing = placedBoards.filter((b) => !localAffine.has(b.number)).map((b) => b.number);
    throw new EngineInputError(
      `boards ${missing.join(', ')} have no local transform and no panel fiducial is measured on the ${side} side; measure panel fiducials or two local fiducials on every board`,
      { file: jobFile, field: 'fiducials', code: 'incomplete-alignment' },
    );
  }
  const frame = transform || boardTransforms.length > 0 ? 'machine' : 'panel';
  const panelT: Affine = transform ? transformToAffine(transform) : { a: 1, b: 0, c: 0, d: 1, tx: 0, ty: 0 };
  const rotOf = (t: Affine) => (Math.atan2(t.c, t.a) * 180) / Math.PI;
  const outputMapOf = (n: number): Affine => localAffine.get(n) ?? panelT;

  // ---- assignments per source part ----------------------------------------------------------
  const overrides = job.overrides ?? {};
  const assigner = new Assigner(library, job.machine ? job.machine.nozzles : null, overrides);
  const overriding = assigner.hasOverrides;
  if (!library) warnings.push({ line: null, message: 'no library: no part has a package', code: 'no-library' });
  const src = imported.table ?? placementsToTable(imported.placements);
  const sideCode = side === 'bottom' ? 1 : 0;
  const parts: number[] = [];
  for (let i = 0; i < src.count; i++) if (src.bottom[i] === sideCode && src.dnp[i] === 0) parts.push(i);
  const m = parts.length;
  const sx = new Float64Array(m), sy = new Float64Array(m), srot = new Float64Array(m);
  const offX = new Float64Array(m), offY = new Float64Array(m), hasOff = new Uint8Array(m);
  const pl = new Float64Array(m).fill(NaN), pw = new Float64Array(m).fill(NaN), ph = new Float64Array(m).fill(NaN);
  const court = new Float64Array(m), over = new Uint8Array(m), holder = new Float64Array(m).fill(NaN), tip = new Float64Array(m).fill(NaN);
  const pkgName: (string | null)[] = [], nozzle: (string | null)[] = [], vision: (string | null)[] = [];
  const partIndex = Int32Array.from(parts);
  const unmatched = new Map<string, UnmatchedFootprint>();
  for (let j = 0; j < m; j++) {
    const i = parts[j];
    sx[j] = src.x[i]; sy[j] = src.y[i];
    const fp = src.footprint[i];
    const a = overriding ? assigner.assignPart(src.ref[i], fp) : assigner.assign(fp);
    srot[j] = src.rotation[i] + (a.pkg ? a.pkg.rotationOffset : 0);
    pkgName.push(a.pkg ? a.pkg.name : null);
    nozzle.push(a.nozzle);
    vision.push(a.vision);
    if (a.pkg) {
      const b = a.pkg.body;
      pl[j] = b.length; pw[j] = b.width; ph[j] = b.height;
      offX[j] = b.offsetX; offY[j] = b.offsetY;
      hasOff[j] = b.offsetX !== 0 || b.offsetY !== 0 ? 1 : 0;
      court[j] = a.pkg.courtyard ?? DEFAULT_COURTYARD;
      over[j] = a.pkg.overhang ? 1 : 0;
      if (a.holderRadius !== null) holder[j] = a.holderRadius;
      if (a.tipOuter !== null) tip[j] = a.tipOuter;
    } else {
      court[j] = DEFAULT_COURTYARD;
      const u = unmatched.get(fp) ?? { footprint: fp, count: 0, placements: 0, refs: [] };
      u.count++;
      u.refs.push(src.ref[i]);
      unmatched.set(fp, u);
    }
  }
  for (const u of unmatched.values()) u.placements = u.count * placedBoards.length;
  if (overriding) warnings.push(...overrideWarnings(overrides, assigner, src, side));

  // ---- step-out: the hot loop ---------------------------------------------------------------
  const total = m * placedBoards.length;
  const out = allocatePlacementColumns(total, false);
  let k = 0;
  for (const inst of placedBoards) {
    const T = outputMapOf(inst.number);
    const rotTerm = sideRotationTerm(side, flipAxis, inst.rotation) + rotOf(T);
    stepOut(out, k, composeAffine(T, boardMaps.get(inst.number)!), rotTerm, sx, sy, srot, hasOff, offX, offY);
    k += m;
  }
  // every column but x, y and rotation is derived (per-part data repeated per placed board, the
  // placement index, or the body offset taken back off) and built on first read (defineLazyColumns)
  const B = placedBoards.length;
  const refOne: string[] = [], pnOne: string[] = [], valOne: string[] = [], fpOne: string[] = [], sideOne: Side[] = [];
  for (let j = 0; j < m; j++) {
    const i = parts[j];
    refOne.push(src.ref[i]); pnOne.push(src.partNumber[i]); valOne.push(src.value[i]); fpOne.push(src.footprint[i]); sideOne.push(side);
  }
  defineLazyColumns(out, {
    ref: () => repeatColumn(refOne, B),
    side: () => repeatColumn(sideOne, B),
    partNumber: () => repeatColumn(pnOne, B),
    value: () => repeatColumn(valOne, B),
    footprint: () => repeatColumn(fpOne, B),
    packageName: () => repeatColumn(pkgName, B),
    nozzle: () => repeatColumn(nozzle, B),
    vision: () => repeatColumn(vision, B),
    bodyLength: () => repeatTyped(pl, B),
    bodyWidth: () => repeatTyped(pw, B),
    bodyHeight: () => repeatTyped(ph, B),
    courtyard: () => repeatTyped(court, B),
    overhang: () => repeatTyped(over, B),
    holderRadius: () => repeatTyped(holder, B),
    nozzleTip: () => repeatTyped(tip, B),
    seq: () => {
      const a = new Int32Array(total);
      for (let i = 0; i < total; i++) a[i] = i + 1;
      return a;
    },
    board: () => {
      const a = new Int32Array(total);
      placedBoards.forEach((b, bi) => a.fill(b.number, bi * m, (bi + 1) * m));
      return a;
    },
    sourceIndex: () => repeatTyped(partIndex, B),
    originX: () => originColumn(out, 'x', m, hasOff, offX, offY),
    originY: () => originColumn(out, 'y', m, hasOff, offX, offY),
  });

  // ---- outlines and fiducials in the output frame ----------------------------------------------
  const boards: BoardInstanceResult[] = instances.map((inst) => {
    const M = composeAffine(outputMapOf(inst.number), boardToPanel(inst.number));
    return {
      number: inst.number,
      anchor: { x: inst.anchorX, y: inst.anchorY },
      rotation: inst.rotation,
      skipped: inst.skipped,
      ...(inst.row !== undefined ? { row: inst.row, col: inst.col } : {}),
      outline: quad(mapRect(M, board.width, board.height)),
      localTransform: localAffine.has(inst.number),
    };
  });
  const fiducials: FiducialUsed[] = fids.map((f) => {
    const T = f.board !== undefined ? outputMapOf(f.board) : panelT;
    const q = applyAffine(T, f.p.x, f.p.y);
    return {
      name: f.name,
      side,
      frame: f.frame,
      ...(f.board !== undefined ? { board: f.board } : {}),
      x: q.x,
      y: q.y,
      panelX: f.p.x,
      panelY: f.p.y,
      measured: f.measured,
      clearRadius: f.clearRadius,
    };
  });

  return {
    side,
    frame,
    program: job.program ?? null,
    revision: job.revision ?? null,
    placements: out,
    boards,
    boardsPlaced: placedBoards.length,
    board: { width: board.width, height: board.height, originX: board.originX, originY: board.originY },
    panel: { width: PW, height: PH, outline: quad(mapRect(composeAffine(panelT, S), PW, PH)), flipAxis },
    fiducials,
    transform,
    boardTransforms,
    unmatched: [...unmatched.values()],
    machine: job.machine
      ? { name: job.machine.name ?? null, reachX: job.machine.reachX, reachY: job.machine.reachY, nozzles: job.machine.nozzles }
      : null,
    import: imported,
    warnings,
  };
}

/**
 * Overrides that could not be applied as written, and overrides of references that are not in
 * the centroid file (reported with the top side only, so a two-sided run says it once).
 */
function overrideWarnings(overrides: Readonly<Record<string, unknown>>, assigner: Assigner, src: { count: number; ref: string[] }, side: Side): EngineWarning[] {
  const out: EngineWarning[] = assigner.problems.map((p) => ({ line: null, message: p.message, code: 'override-unknown-name' }));
  if (side === 'top') {
    const refs = new Set(src.ref);
    for (const ref of Object.keys(overrides)) {
      if (!refs.has(ref)) out.push({ line: null, message: `override of ${ref}: no part ${ref} in the centroid file`, code: 'override-unknown-ref' });
    }
  }
  return out;
}

/** `n` copies of a typed column, one after another. */
function repeatTyped<A extends Float64Array | Uint8Array | Int32Array>(one: A, n: number): A {
  const out = new (one.constructor as { new (len: number): A })(one.length * n);
  for (let i = 0; i < n; i++) out.set(one, i * one.length);
  return out;
}

/** `n` copies of a column, one after another, as one packed array (native concat). */
function repeatColumn<T>(one: T[], n: number): T[] {
  if (n === 0) return [];
  const copies: T[][] = [];
  for (let i = 0; i < n; i++) copies.push(one);
  return Array.prototype.concat.apply([], copies) as T[];
}

/**
 * The hot loop: one board's parts through M (design → output frame), from index k0 on.
 * Rotation = part term (θ or θb, plus the package offset) + board term, normalised to [0, 360);
 * body centre = placement + body offset turned by that rotation (not scaled).
 */
function stepOut(
  out: PlacementColumns,
  k0: number,
  M: Affine,
  rotTerm: number,
  sx: Float64Array,
  sy: Float64Array,
  srot: Float64Array,
  hasOff: Uint8Array,
  offX: Float64Array,
  offY: Float64Array,
): void {
  const { x: ox, y: oy, rotation } = out;
  const a = M.a, b = M.b, c = M.c, d = M.d, tx = M.tx, ty = M.ty;
  const m = sx.length;
  const DEG = Math.PI / 180;
  for (let j = 0, k = k0; j < m; j++, k++) {
    const u = sx[j], v = sy[j];
    const X = a * u + b * v + tx;
    const Y = c * u + d * v + ty;
    let r = (srot[j] + rotTerm) % 360;
    if (r < 0) r += 360;
    if (r >= 360 - 1e-9 || r < 1e-12) r = 0;
    rotation[k] = r;
    if (hasOff[j] === 1) {
      const cs = Math.cos(r * DEG), sn = Math.sin(r * DEG);
      ox[k] = X + cs * offX[j] - sn * offY[j];
      oy[k] = Y + sn * offX[j] + cs * offY[j];
    } else {
      ox[k] = X;
      oy[k] = Y;
    }
  }
}

/** The placement point: the body centre minus the body offset turned by the rotation. */
function originColumn(out: PlacementColumns, axis: 'x' | 'y', m: number, hasOff: Uint8Array, offX: Float64Array, offY: Float64Array): Float64Array {
  const res = (axis === 'x' ? out.x : out.y).slice();
  const withOffset: number[] = [];
  for (let j = 0; j < m; j++) if (hasOff[j] === 1) withOffset.push(j);
  if (withOffset.length === 0) return res;
  const rot = out.rotation;
  const DEG = Math.PI / 180;
  for (let k0 = 0; k0 < res.length; k0 += m) {
    for (const j of withOffset) {
      const k = k0 + j;
      const cs = Math.cos(rot[k] * DEG), sn = Math.sin(rot[k] * DEG);
      res[k] -= axis === 'x' ? cs * offX[j] - sn * offY[j] : sn * offX[j] + cs * offY[j];
    }
  }
  return res;
}
