// The findings engine's input checks: precise messages for a caller that hands over a bad
// VerifyInput (lengths, side codes, outlines, numbers). The hot path (prepare.ts) checks the numbers
// in its single pass and calls validateInput only to name a bad one.
import type { VerifyInput } from './types';

export class VerifyInputError extends Error {
  override name = 'VerifyInputError';
}
// ---------------------------------------------------------------------------------------------
// Input checks (precise misuse errors)

const NUMERIC = ['cx', 'cy', 'angleDeg', 'length', 'width', 'height', 'courtyard', 'holderRadius'] as const;
const NON_NEGATIVE = new Set(['length', 'width', 'height', 'courtyard', 'holderRadius']);
const FLAGS = ['side', 'overhang', 'hasPackage', 'hasNozzle'] as const;

/** Full validation: shape, then every number (precise messages). */
export function validateInput(input: VerifyInput): void {
  validateShape(input);
  const n = input.count;
  for (const f of NUMERIC) {
    const a = input[f];
    const nonNeg = NON_NEGATIVE.has(f);
    const lo = nonNeg ? 0 : -Infinity;
    for (let i = 0; i < n; i++) {
      const v = a[i];
      // v - v is NaN for NaN and ±Infinity
      if (v - v !== 0 || v < lo) {
        throw new VerifyInputError(
          `${f}[${i}] (${input.ref[i]}) is ${v}, expected a finite number${nonNeg ? ' ≥ 0' : ''}`,
        );
      }
    }
  }
}

/** Array lengths, side codes, outlines, fiducials, reach (the per-number checks run inside
 * prepare's single pass, falling back to validateInput for the message). */
export function validateShape(input: VerifyInput): void {
  const n = input.count;
  if (!Number.isInteger(n) || n < 0) throw new VerifyInputError(`count must be a whole number ≥ 0, got ${n}`);
  const len = (name: string, v: { length: number } | undefined): void => {
    if (!v) throw new VerifyInputError(`${name} is missing, expected ${n} values`);
    if (v.length !== n) throw new VerifyInputError(`${name} has ${v.length} values, expected ${n} (count)`);
  };
  len('ref', input.ref);
  len('board', input.board);
  for (const f of FLAGS) len(f, input[f]);
  for (const f of NUMERIC) len(f, input[f]);
  const side = input.side;
  for (let i = 0; i < n; i++) {
    if (side[i] > 1) throw new VerifyInputError(`side[${i}] (${input.ref[i]}) is ${side[i]}, expected 0 (top) or 1 (bottom)`);
  }
  const quad = (what: string, c: ArrayLike<number>): void => {
    if (!c || c.length !== 8) throw new VerifyInputError(`${what} has ${c ? c.length : 0} corner numbers, expected 8`);
    for (let k = 0; k < 8; k++) if (!Number.isFinite(c[k])) throw new VerifyInputError(`${what} corner value ${k} is ${c[k]}`);
  };
  input.boards.forEach((b, k) => quad(`boards[${k}] (board ${b.board}, ${b.side})`, b.corners));
  input.panels.forEach((p, k) => quad(`panels[${k}] (${p.side})`, p.corners));
  input.fiducials.forEach((f, k) => {
    if (![f.x, f.y, f.clearRadius].every(Number.isFinite) || f.clearRadius < 0) {
      throw new VerifyInputError(`fiducials[${k}] (${f.name}) needs finite x, y and clearRadius ≥ 0`);
    }
  });
  if (input.reach && !(input.reach.x >= 0 && input.reach.y >= 0)) {
    throw new VerifyInputError(`reach must have x ≥ 0 and y ≥ 0, got ${input.reach.x} × ${input.reach.y}`);
  }
}
