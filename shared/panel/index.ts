// Panel step-and-repeat (shared/README.md, "Step-and-repeat") and the bottom flip ("Rotation and the bottom side").
import { boundsOf, composeAffine, mapRect, normDeg, rotationAffine, type Affine } from '../geometry';
import { EngineInputError } from '../core';
import type { FlipAxis, Side } from '../core';
import type { JobPanel } from '../schemas/job.schema';

export interface BoardInstance {
  /** 1-based board number */
  number: number;
  /** anchor A in the top-view panel frame */
  anchorX: number;
  anchorY: number;
  /** φ, deg [0, 360) */
  rotation: number;
  skipped: boolean;
  row?: number;
  col?: number;
}

/**
 * The panel's board instances in number order. A grid numbers row by row from the bottom-left
 * (n = row·cols + col + 1); a `cellRotations` entry replaces `grid.rotation` for its cell.
 */
export function boardInstances(panel: JobPanel, file?: string): BoardInstance[] {
  if (panel.instances) {
    return panel.instances.map((inst, i) => ({
      number: i + 1,
      anchorX: inst.x,
      anchorY: inst.y,
      rotation: normDeg(inst.rotation),
      skipped: inst.skip,
    }));
  }
  const g = panel.grid;
  if (!g) throw new EngineInputError('the panel needs a grid or instances', { file, field: 'panel', code: 'bad-field' });
  const key = (r: number, c: number) => r * g.cols + c;
  const check = (what: string, i: number, row: number, col: number) => {
    if (row >= g.rows || col >= g.cols) {
      throw new EngineInputError(`cell row ${row}, col ${col} is outside the ${g.rows} × ${g.cols} grid`, {
        file, field: `panel.grid.${what}[${i}]`, code: 'bad-cell',
      });
    }
  };
  const rot = new Map<number, number>();
  g.cellRotations.forEach((c, i) => {
    check('cellRotations', i, c.row, c.col);
    rot.set(key(c.row, c.col), c.rotation);
  });
  const skip = new Set<number>();
  g.skip.forEach((c, i) => {
    check('skip', i, c.row, c.col);
    skip.add(key(c.row, c.col));
  });
  const out: BoardInstance[] = [];
  for (let row = 0; row < g.rows; row++) {
    for (let col = 0; col < g.cols; col++) {
      const k = key(row, col);
      out.push({
        number: k + 1,
        anchorX: g.offsetX + col * g.pitchX,
        anchorY: g.offsetY + row * g.pitchY,
        rotation: normDeg(rot.get(k) ?? g.rotation),
        skipped: skip.has(k),
        row,
        col,
      });
    }
  }
  return out;
}

/**
 * Board frame (u, v) → top-view panel frame: rotate by φ about the board's lower-left corner, then
 * translate so the lower-left of the rotated board's bounding box lies on the anchor.
 */
export function instanceAffine(inst: Pick<BoardInstance, 'anchorX' | 'anchorY' | 'rotation'>, width: number, height: number): Affine {
  const R = rotationAffine(inst.rotation);
  const b = boundsOf(mapRect(R, width, height));
  return { ...R, tx: inst.anchorX - b.minX, ty: inst.anchorY - b.minY };
}

/** Top-view panel frame → the panel frame of the side being placed (identity for top). */
export function sideAffine(side: Side, flipAxis: FlipAxis, panelWidth: number, panelHeight: number): Affine {
  if (side === 'top') return { a: 1, b: 0, c: 0, d: 1, tx: 0, ty: 0 };
  if (flipAxis === 'vertical') return { a: -1, b: 0, c: 0, d: 1, tx: panelWidth, ty: 0 };
  return { a: 1, b: 0, c: 0, d: -1, tx: 0, ty: panelHeight };
}

/** What the board instance adds to a part's rotation on that side: φ (top), −φ (bottom, vertical
 * flip), −φ + 180 (bottom, horizontal flip). The part's own term is θ (top) or θb (bottom). */
export function sideRotationTerm(side: Side, flipAxis: FlipAxis, phi: number): number {
  if (side === 'top') return phi;
  return flipAxis === 'vertical' ? -phi : 180 - phi;
}

/** Design frame → board frame. */
export function designToBoard(originX: number, originY: number): Affine {
  return { a: 1, b: 0, c: 0, d: 1, tx: -originX, ty: -originY };
}

/** Design frame → side panel frame for one instance. */
export function designToSidePanel(
  inst: Pick<BoardInstance, 'anchorX' | 'anchorY' | 'rotation'>,
  board: { originX: number; originY: number; width: number; height: number },
  side: Side,
  flipAxis: FlipAxis,
  panelWidth: number,
  panelHeight: number,
): Affine {
  return composeAffine(
    sideAffine(side, flipAxis, panelWidth, panelHeight),
    composeAffine(instanceAffine(inst, board.width, board.height), designToBoard(board.originX, board.originY)),
  );
}
