// Input and result types of the findings engine (shared/verify). The engine has its OWN input
// type — a struct of arrays that a worker thread can receive by structured clone — so that it does
// not depend on how the pipeline happens to lay out its result; shared/verify/from-job.ts adapts a
// pipeline run to it.
//
// Frame: every x/y is in the output frame of the placement's side (machine frame when a fiducial
// transform was applied, else the panel frame; bottom side: the bottom panel frame). Units: mm and
// degrees (counter-clockwise).

import type { Finding, FindingKind } from '../schemas/finding.schema';

export type { Finding, FindingKind };

/** 0 = top, 1 = bottom (the values of `VerifyInput.side`). */
export const SIDE_TOP = 0;
export const SIDE_BOTTOM = 1;
export type SideName = 'top' | 'bottom';
export const SIDE_NAMES: readonly SideName[] = ['top', 'bottom'];

/** A convex quadrilateral given by its four corners in order (either winding). A board or panel
 * outline after an affine transform is a parallelogram, so four corners are always enough. */
export type QuadCorners = [number, number, number, number, number, number, number, number];

export interface BoardOutline {
  /** 1-based board number */
  board: number;
  side: SideName;
  /** x0, y0, x1, y1, x2, y2, x3, y3 */
  corners: QuadCorners;
}

export interface PanelOutline {
  side: SideName;
  corners: QuadCorners;
}

export interface VerifyFiducial {
  name: string;
  side: SideName;
  x: number;
  y: number;
  /** clear circle radius, mm */
  clearRadius: number;
}

/**
 * Placements to check, as a struct of arrays of length `count` (index i of every array is the
 * same placement). Do-not-place parts must not be in it. A part without a package has length =
 * width = height = 0 (a point body) and courtyard 0; a part without a nozzle has holderRadius 0.
 */
export interface VerifyInput {
  count: number;
  /** reference designator, e.g. "C12" */
  ref: string[];
  /** 1-based board number */
  board: Int32Array;
  /** SIDE_TOP or SIDE_BOTTOM */
  side: Uint8Array;
  /** body centre, output frame, mm */
  cx: Float64Array;
  cy: Float64Array;
  /** body rotation, deg CCW: the body's length runs along this direction */
  angleDeg: Float64Array;
  /** body length (along the rotated X) and width, mm */
  length: Float64Array;
  width: Float64Array;
  /** body height, mm */
  height: Float64Array;
  /** courtyard excess around the body, mm */
  courtyard: Float64Array;
  /** nozzle holder radius, mm (0 when no nozzle) */
  holderRadius: Float64Array;
  /** 1 when the package is marked `overhang` (off-board becomes a warning) */
  overhang: Uint8Array;
  /** 1 when the footprint matched a package */
  hasPackage: Uint8Array;
  /** 1 when a nozzle of the package is on the machine */
  hasNozzle: Uint8Array;
  /** outer diameter of the nozzle tip, mm (0 or NaN: unknown, not checked); optional */
  tipOuter?: Float64Array;
  /** optional texts for messages */
  nozzle?: (string | null)[];
  footprint?: string[];
  packageName?: (string | null)[];
  boards: BoardOutline[];
  /** the panel outline per side (used for off-panel and the panel's reach) */
  panels: PanelOutline[];
  fiducials: VerifyFiducial[];
  /** machine reach [0, x] × [0, y] in the output frame; null = no machine, no reach check */
  reach: { x: number; y: number } | null;
}

export type SideChoice = 'top' | 'bottom' | 'both';

export interface VerifyOptions {
  /** sides to check (default both) */
  sides?: SideChoice;
  /** at most this many findings are returned as objects (default 10,000); the summary still
   * counts all of them and says `truncated`. Keeps memory bounded on pathological inputs. */
  limit?: number;
}

export interface VerifySummary {
  errors: number;
  warnings: number;
  /** placements checked (on the sides checked) */
  placements: number;
  byKind: Record<FindingKind, number>;
  /** true when more findings were found than returned */
  truncated: boolean;
  seconds: number;
}

export interface VerifyResult {
  findings: Finding[];
  summary: VerifySummary;
}
