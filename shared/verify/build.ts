// Building a VerifyInput from plain part records: for tests, small tools and the client. Large
// inputs should fill the typed arrays directly (see from-job.ts).
import {
  SIDE_BOTTOM,
  SIDE_TOP,
  type BoardOutline,
  type PanelOutline,
  type SideName,
  type VerifyFiducial,
  type VerifyInput,
} from './types';

export interface PartSpec {
  ref: string;
  /** default 1 */
  board?: number;
  /** default top */
  side?: SideName;
  /** body centre */
  x: number;
  y: number;
  /** deg, default 0 */
  angle?: number;
  /** body size; 0 × 0 for a part without a package */
  length: number;
  width: number;
  /** default 1 */
  height?: number;
  /** default 0.25 */
  courtyard?: number;
  /** default 0 (no shadow check) */
  holderRadius?: number;
  /** nozzle tip outer diameter, default 0 (no nozzle-size check) */
  tipOuter?: number;
  nozzle?: string | null;
  overhang?: boolean;
  /** default true */
  hasPackage?: boolean;
  /** default true */
  hasNozzle?: boolean;
  footprint?: string;
  packageName?: string | null;
}

export interface LayoutSpec {
  boards?: BoardOutline[];
  panels?: PanelOutline[];
  fiducials?: VerifyFiducial[];
  reach?: { x: number; y: number } | null;
}

export function makeVerifyInput(parts: PartSpec[], layout: LayoutSpec = {}): VerifyInput {
  const n = parts.length;
  const f64 = () => new Float64Array(n);
  const u8 = () => new Uint8Array(n);
  const input: VerifyInput = {
    count: n,
    ref: parts.map((p) => p.ref),
    board: Int32Array.from(parts, (p) => p.board ?? 1),
    side: u8(),
    cx: f64(),
    cy: f64(),
    angleDeg: f64(),
    length: f64(),
    width: f64(),
    height: f64(),
    courtyard: f64(),
    holderRadius: f64(),
    tipOuter: f64(),
    nozzle: parts.map((p) => p.nozzle ?? null),
    overhang: u8(),
    hasPackage: u8(),
    hasNozzle: u8(),
    footprint: parts.map((p) => p.footprint ?? ''),
    packageName: parts.map((p) => p.packageName ?? null),
    boards: layout.boards ?? [],
    panels: layout.panels ?? [],
    fiducials: layout.fiducials ?? [],
    reach: layout.reach ?? null,
  };
  parts.forEach((p, i) => {
    input.side[i] = p.side === 'bottom' ? SIDE_BOTTOM : SIDE_TOP;
    input.cx[i] = p.x;
    input.cy[i] = p.y;
    input.angleDeg[i] = p.angle ?? 0;
    input.length[i] = p.length;
    input.width[i] = p.width;
    input.height[i] = p.height ?? 1;
    input.courtyard[i] = p.courtyard ?? 0.25;
    input.holderRadius[i] = p.holderRadius ?? 0;
    input.tipOuter![i] = p.tipOuter ?? 0;
    input.overhang[i] = p.overhang ? 1 : 0;
    input.hasPackage[i] = p.hasPackage === false ? 0 : 1;
    input.hasNozzle[i] = p.hasNozzle === false ? 0 : 1;
  });
  return input;
}

/** Axis-aligned rectangle as a quad (x0, y0) – (x1, y1), counter-clockwise from the lower left. */
export function rectQuad(x0: number, y0: number, x1: number, y1: number): [number, number, number, number, number, number, number, number] {
  return [x0, y0, x1, y0, x1, y1, x0, y1];
}
