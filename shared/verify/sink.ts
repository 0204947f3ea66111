// Compact store of raw findings during a check: a few growable typed arrays instead of objects,
// capped per kind, so a pathological panel (every part on top of every other) cannot exhaust
// memory. Objects with messages are built afterwards (report.ts), for the kept records only.

export const K_BODY = 0;
export const K_COURTYARD = 1;
export const K_OFF_BOARD = 2;
export const K_BOARD_OVERLAP = 3;
export const K_OFF_PANEL = 4;
export const K_FIDUCIAL = 5;
export const K_SHADOW = 6;
export const K_REACH = 7;
export const K_PANEL_REACH = 8;
export const K_NO_PACKAGE = 9;
export const K_NO_NOZZLE = 10;
/** off-board of a package marked `overhang`: a warning */
export const K_OVERHANG = 11;
/** the nozzle tip is wider than the body's smaller side: a warning */
export const K_NOZZLE_SIZE = 12;
export const RAW_KINDS = 13;

/** Measurement hook for the bench: called at the end of each phase when set (null otherwise). */
export const verifyProbe: { onPhase: ((phase: string) => void) | null } = { onPhase: null };

export class FindingSink {
  /** records kept */
  size = 0;
  /** all records found, kept or not, per raw kind */
  readonly found = new Float64Array(RAW_KINDS);
  readonly kept = new Int32Array(RAW_KINDS);
  kind: Uint8Array;
  /** first / second subject: placement index, or board-outline index, or panel index */
  a: Int32Array;
  b: Int32Array;
  /** extra index: fiducial index, side */
  aux: Int32Array;
  depth: Float64Array;
  dist: Float64Array;

  constructor(readonly capPerKind: number) {
    const n = 64;
    this.kind = new Uint8Array(n);
    this.a = new Int32Array(n);
    this.b = new Int32Array(n);
    this.aux = new Int32Array(n);
    this.depth = new Float64Array(n);
    this.dist = new Float64Array(n);
  }

  /** Store a record; returns its slot, or -1 when the kind's cap is reached (still counted). */
  add(kind: number, a: number, b: number, aux: number, depth: number, dist: number): number {
    this.found[kind]++;
    if (this.kept[kind] >= this.capPerKind) return -1;
    this.kept[kind]++;
    if (this.size === this.kind.length) this.grow();
    const k = this.size++;
    this.kind[k] = kind;
    this.a[k] = a;
    this.b[k] = b;
    this.aux[k] = aux;
    this.depth[k] = depth;
    this.dist[k] = dist;
    return k;
  }

  private grow(): void {
    const n = this.kind.length * 2;
    const g = <T extends Uint8Array | Int32Array | Float64Array>(old: T, make: (n: number) => T): T => {
      const x = make(n);
      x.set(old as never);
      return x;
    };
    this.kind = g(this.kind, (m) => new Uint8Array(m));
    this.a = g(this.a, (m) => new Int32Array(m));
    this.b = g(this.b, (m) => new Int32Array(m));
    this.aux = g(this.aux, (m) => new Int32Array(m));
    this.depth = g(this.depth, (m) => new Float64Array(m));
    this.dist = g(this.dist, (m) => new Float64Array(m));
  }
}
