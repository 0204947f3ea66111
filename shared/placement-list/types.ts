// The neutral placement list, format 1 (shared/placement-list/README.md), as read back.
export const LIST_FORMAT = 'placewright-placement-list/1';
export const CSV_HEADER = 'seq,board,ref,x,y,rotation,package,nozzle,vision,height,part_number,value';

export interface ListPlacement {
  seq: number;
  board: number;
  ref: string;
  x: number;
  y: number;
  rotation: number;
  package: string | null;
  nozzle: string | null;
  vision: string | null;
  height: number | null;
  partNumber: string;
  value: string;
}

export interface ListTransform {
  model: string;
  rotationDeg: number;
  scale: number;
  tx: number;
  ty: number;
  matrix: [[number, number, number], [number, number, number]];
  rmsResidual: number;
}

export interface ListMeta {
  program: string;
  revision: string;
  side: 'top' | 'bottom';
  units: 'mm';
  frame: 'machine' | 'panel';
  /** null when no transform was applied (CSV `model=none`) */
  transform: ListTransform | null;
  boards: number;
  placements: number;
  generated: string;
  /** CSV only */
  sha256?: string;
  /** metadata lines with keys this reader does not know (CSV), in order */
  extra?: { key: string; value: string }[];
}

export interface PlacementList {
  format: typeof LIST_FORMAT;
  encoding: 'csv' | 'json';
  meta: ListMeta;
  fiducials: { name: string; x: number; y: number }[];
  placements: ListPlacement[];
}

/** What the writer needs beyond the engine result. */
export interface WriteOptions {
  /** defaults to the job's program / revision, else "" */
  program?: string;
  revision?: string;
  /** ISO 8601 UTC; a Date is converted; defaults to now */
  generated?: Date | string;
}
