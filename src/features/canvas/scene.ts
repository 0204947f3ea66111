// Everything the canvas draws for one run, prepared once per run: body and courtyard corners,
// pin-1 marks, the spatial index, the "BOARD:REF" → placement lookup and the part ↔ finding links.
// Geometry comes from shared/canvas (batch helpers over the engine's RunResult); nothing here
// re-derives a placement.
import { bodyQuads, buildBodyIndex, invertAffine, pinOneMarks, quadBoxes, type BodyIndex } from '../../../shared/canvas';
import { boundsOf, type Affine, type Box } from '../../../shared/geometry';
import { transformToAffine } from '../../../shared/fiducials';
import type { RunResult } from '../../../shared/core';
import type { Finding } from '../../../shared/schemas/finding.schema';
import type { SelectionLinks } from './store';

export interface Scene {
  run: RunResult;
  quads: Float64Array;
  boxes: Float64Array;
  /** computed on first use (the courtyard layer starts hidden) */
  readonly courtyards: Float64Array;
  marks: Float64Array;
  index: BodyIndex;
  /** panel outline, boards and bodies: what "fit" shows */
  bounds: Box;
  /** bounding box of all bodies (drawing: skip culling when all are on screen) */
  bodyBounds: Box;
  byRef: Map<string, number>;
  findings: Finding[];
  findingBoxes: Box[];
  links: SelectionLinks;
  /** output frame → panel frame (inverse of the panel fiducial transform), identity when the
   * output frame is the panel frame; null when only board-local transforms exist */
  toPanel: Affine | null;
  /** output frame → machine frame: identity when the output frame is the machine frame */
  toMachine: Affine | null;
}

const ID: Affine = { a: 1, b: 0, c: 0, d: 1, tx: 0, ty: 0 };

export function findingBox(f: Finding): Box {
  const g = f.geometry;
  if (g.type === 'point') return { minX: g.x, minY: g.y, maxX: g.x, maxY: g.y };
  if (g.type === 'segment') return boundsOf([{ x: g.from[0], y: g.from[1] }, { x: g.to[0], y: g.to[1] }]);
  return boundsOf(g.points.map(([x, y]) => ({ x, y })));
}

export function buildScene(run: RunResult, allFindings: readonly Finding[]): Scene {
  const p = run.placements;
  const quads = bodyQuads(p);
  const boxes = quadBoxes(quads);
  const marks = pinOneMarks(p);
  const index = buildBodyIndex(quads, boxes);
  const byRef = new Map<string, number>();
  for (let i = 0; i < p.count; i++) byRef.set(`${p.board[i]}:${p.ref[i]}`, i);

  let bMinX = Infinity, bMinY = Infinity, bMaxX = -Infinity, bMaxY = -Infinity;
  for (let i = 0; i < p.count; i++) {
    const k = 4 * i;
    if (boxes[k] < bMinX) bMinX = boxes[k];
    if (boxes[k + 1] < bMinY) bMinY = boxes[k + 1];
    if (boxes[k + 2] > bMaxX) bMaxX = boxes[k + 2];
    if (boxes[k + 3] > bMaxY) bMaxY = boxes[k + 3];
  }
  const bodyBounds: Box = p.count ? { minX: bMinX, minY: bMinY, maxX: bMaxX, maxY: bMaxY } : { minX: 0, minY: 0, maxX: 0, maxY: 0 };
  const outline = [...run.panel.outline, ...run.boards.flatMap((b) => b.outline)];
  const ob = boundsOf(outline);
  const bounds: Box = p.count
    ? { minX: Math.min(ob.minX, bMinX), minY: Math.min(ob.minY, bMinY), maxX: Math.max(ob.maxX, bMaxX), maxY: Math.max(ob.maxY, bMaxY) }
    : ob;

  const findings = allFindings.filter((f) => f.side === run.side);
  const partFindings = new Map<number, string[]>();
  const findingParts = new Map<string, number[]>();
  for (const f of findings) {
    const parts: number[] = [];
    for (const r of f.refs) {
      const i = byRef.get(r);
      if (i === undefined) continue;
      parts.push(i);
      const list = partFindings.get(i);
      if (list) list.push(f.key);
      else partFindings.set(i, [f.key]);
    }
    findingParts.set(f.key, parts);
  }

  let toPanel: Affine | null = ID;
  let toMachine: Affine | null = null;
  if (run.frame === 'machine') {
    toMachine = ID;
    toPanel = run.transform ? invertAffine(transformToAffine(run.transform)) : null;
  }
  let courtyards: Float64Array | null = null;
  return {
    run, quads, boxes, marks, index, bounds, bodyBounds, byRef, findings,
    get courtyards() {
      return (courtyards ??= bodyQuads(p, true));
    },
    findingBoxes: findings.map(findingBox),
    links: { partFindings, findingParts },
    toPanel, toMachine,
  };
}

/** Per-placement dimming from the filters: 1 = drawn dim. Null when no filter is set. */
export function dimMask(
  scene: Scene,
  filters: { packages: readonly string[]; nozzles: readonly string[]; kinds: readonly string[] },
): Uint8Array | null {
  const { packages, nozzles, kinds } = filters;
  if (!packages.length && !nozzles.length && !kinds.length) return null;
  const p = scene.run.placements;
  const dim = new Uint8Array(p.count);
  const pk = new Set(packages);
  const nz = new Set(nozzles);
  let kindParts: Set<number> | null = null;
  if (kinds.length) {
    const ks = new Set(kinds);
    kindParts = new Set();
    for (const f of scene.findings) if (ks.has(f.kind)) for (const i of scene.links.findingParts.get(f.key) ?? []) kindParts.add(i);
  }
  for (let i = 0; i < p.count; i++) {
    const ok =
      (!pk.size || pk.has(p.packageName[i] ?? '(none)')) &&
      (!nz.size || nz.has(p.nozzle[i] ?? '(none)')) &&
      (!kindParts || kindParts.has(i));
    dim[i] = ok ? 0 : 1;
  }
  return dim;
}
