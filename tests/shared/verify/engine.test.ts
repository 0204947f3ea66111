// The findings engine as a whole: the indexed run against the brute-force run (same exact tests on
// every pair), invariance under input order, the bound on findings, misuse errors, the schema.
import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { verify, verifyBruteForce, VerifyInputError } from '../../../shared/verify';
import { makeVerifyInput, rectQuad, type PartSpec } from '../../../shared/verify/build';
import { compareRefs } from '../../../shared/verify/natural';
import { checkResultSchema, findingSchema, FINDING_KINDS } from '../../../shared/schemas/finding.schema';
import type { VerifyInput } from '../../../shared/verify';
import runVerifyTask from '../../../shared/verify/task';
import { mulberry32 } from '../../helpers/prng';
import { randomPanel } from './random-panel';

/** A crowded random two-sided layout: many overlaps, courtyards, shadows, strays. */
function crowded(seed: number, n: number): VerifyInput {
  const rnd = mulberry32(seed);
  const sizes = [
    [1.0, 0.5, 0.35, 2.0],
    [1.6, 0.8, 0.45, 2.5],
    [2.9, 1.3, 1.0, 2.5],
    [4.9, 3.9, 1.75, 3.5],
    [6.6, 6.6, 5.8, 6.0],
  ];
  const parts: PartSpec[] = [];
  for (let i = 0; i < n; i++) {
    const [L, W, H, R] = sizes[Math.floor(rnd() * sizes.length)];
    const board = 1 + Math.floor(rnd() * 3);
    parts.push({
      ref: `${'RCUQ'[Math.floor(rnd() * 4)]}${1 + Math.floor(rnd() * 60)}`,
      board,
      side: rnd() < 0.7 ? 'top' : 'bottom',
      x: (board - 1) * 30 + rnd() * 32 - 1,
      y: rnd() * 22 - 1,
      angle: rnd() < 0.6 ? 90 * Math.floor(rnd() * 4) : rnd() * 360,
      length: L,
      width: W,
      height: H,
      courtyard: rnd() < 0.5 ? 0.25 : 0.1,
      holderRadius: rnd() < 0.95 ? R : 0,
      hasNozzle: rnd() < 0.97,
      hasPackage: rnd() < 0.97,
      overhang: rnd() < 0.1,
    });
  }
  // unique (board, ref)
  const seen = new Set<string>();
  parts.forEach((p, i) => {
    while (seen.has(`${p.board}:${p.ref}`)) p.ref = `${p.ref}X${i}`;
    seen.add(`${p.board}:${p.ref}`);
  });
  const boards = [1, 2, 3].flatMap((b) => [
    { board: b, side: 'top' as const, corners: rectQuad((b - 1) * 30, 0, (b - 1) * 30 + 30.5, 20) },
    { board: b, side: 'bottom' as const, corners: rectQuad((b - 1) * 30, 0, (b - 1) * 30 + 30.5, 20) },
  ]);
  return makeVerifyInput(parts, {
    boards,
    panels: [
      { side: 'top', corners: rectQuad(0, 0, 90, 20) },
      { side: 'bottom', corners: rectQuad(0, 0, 90, 20) },
    ],
    fiducials: [
      { name: 'F1', side: 'top', x: 5, y: 5, clearRadius: 1.5 },
      { name: 'F2', side: 'top', x: 45, y: 10, clearRadius: 1.0 },
      { name: 'F3', side: 'bottom', x: 80, y: 15, clearRadius: 2.0 },
    ],
    reach: { x: 85, y: 19 },
  });
}

describe('indexed run = brute-force run', () => {
  test.each([1, 2, 3, 4, 5])('crowded layout, seed %i', (seed) => {
    const input = crowded(seed, 400);
    const a = verify(input);
    const b = verifyBruteForce(input);
    // every kind shows up, so the comparison covers them all
    const kinds = new Set(a.findings.map((f) => f.kind));
    for (const k of ['body-overlap', 'courtyard-overlap', 'off-board', 'board-overlap', 'fiducial-clearance', 'nozzle-shadow', 'out-of-reach', 'no-package', 'no-nozzle']) {
      expect(kinds.has(k as never)).toBe(true);
    }
    expect(a.findings).toEqual(b.findings);
    expect({ ...a.summary, seconds: 0 }).toEqual({ ...b.summary, seconds: 0 });
  });

  test('any heights and holder radii: the shadow queries from the taller parts miss nothing (property)', () => {
    // heights and radii drawn freely (a low part may have the widest holder, heights may sit on the
    // 0.5 mm step), so the reach of a taller part's query is tested against every pairing
    const heights = [0.35, 0.6, 0.85, 1.1, 1.1000001, 1.6, 2.5, 4.0, 9.5];
    // millimetres in thousandths, spread evenly (fast-check's doubles crowd at the bounds)
    const mm = (min: number, max: number) => fc.integer({ min: min * 1000, max: max * 1000 }).map((v) => v / 1000);
    const part = fc.record({
      x: mm(0, 25),
      y: mm(0, 25),
      angle: fc.oneof(fc.constantFrom(0, 90, 180, 270), mm(0, 359.999)),
      length: mm(0.2, 8),
      width: mm(0.2, 6),
      height: fc.oneof(fc.constantFrom(...heights), mm(0, 12)),
      holderRadius: fc.oneof(fc.constant(0), mm(0.5, 9)),
    });
    fc.assert(
      fc.property(fc.array(part, { minLength: 2, maxLength: 90 }), (specs) => {
        const parts: PartSpec[] = specs.map((p, i) => ({
          ref: `P${i + 1}`,
          board: 1,
          side: 'top',
          x: p.x,
          y: p.y,
          angle: p.angle,
          length: p.length,
          width: p.width,
          height: p.height,
          courtyard: 0.1,
          holderRadius: p.holderRadius,
        }));
        const input = makeVerifyInput(parts, { boards: [], panels: [], fiducials: [], reach: null });
        const a = verify(input);
        const b = verifyBruteForce(input);
        expect(a.findings.map((f) => f.key)).toEqual(b.findings.map((f) => f.key));
        expect(a.findings).toEqual(b.findings);
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  test('seeded realistic panel (the bench generator), 3,000 parts', () => {
    const input = randomPanel({ placements: 3000, seed: 99, jitterFraction: 0.05 });
    const a = verify(input);
    const b = verifyBruteForce(input);
    expect(a.findings.length).toBeGreaterThan(10);
    expect(a.findings).toEqual(b.findings);
  });
});

describe('order and keys', () => {
  test('the findings do not depend on the order of the placements (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: 1, max: 1e6 }), (seed, shuffleSeed) => {
        const input = crowded(seed, 120);
        const rnd = mulberry32(shuffleSeed);
        const perm = Array.from({ length: input.count }, (_, i) => i);
        for (let i = perm.length - 1; i > 0; i--) {
          const j = Math.floor(rnd() * (i + 1));
          [perm[i], perm[j]] = [perm[j], perm[i]];
        }
        const shuffled = permute(input, perm);
        expect(verify(shuffled).findings).toEqual(verify(input).findings);
      }),
      { numRuns: 25 },
    );
  });

  test('findings come errors first, then by kind, board and natural reference; keys are unique', () => {
    const { findings } = verify(crowded(7, 400));
    const rank = (k: string) => FINDING_KINDS.indexOf(k as never);
    for (let i = 1; i < findings.length; i++) {
      const p = findings[i - 1];
      const q = findings[i];
      const sev = (s: string) => (s === 'error' ? 0 : 1);
      expect(sev(p.severity) <= sev(q.severity)).toBe(true);
      if (p.severity === q.severity) expect(rank(p.kind) <= rank(q.kind)).toBe(true);
    }
    expect(new Set(findings.map((f) => f.key)).size).toBe(findings.length);
    for (const f of findings) {
      // refs sorted: board number, then reference
      const parsed = f.refs.map((r) => [Number(r.split(':')[0]), r.slice(r.indexOf(':') + 1)] as const);
      for (let i = 1; i < parsed.length; i++) {
        const [b0, r0] = parsed[i - 1];
        const [b1, r1] = parsed[i];
        expect(b0 < b1 || (b0 === b1 && compareRefs(r0, r1) < 0)).toBe(true);
      }
      expect(f.key.startsWith(f.kind + '|')).toBe(true);
    }
  });

  test('the same order when board numbers are too large to pack into one numeric sort key', () => {
    const input = crowded(7, 400);
    const shift = 1_000_000_000;
    const big: VerifyInput = {
      ...input,
      board: input.board.map((b) => b + shift),
      boards: input.boards.map((b) => ({ ...b, board: b.board + shift })),
    };
    const unshift = (key: string) => key.replace(/\b1000000(\d{3})\b/g, (_, d: string) => String(Number(d)));
    const expected = verify(input).findings.map((f) => f.key);
    expect(expected.length).toBeGreaterThan(50);
    expect(verify(big).findings.map((f) => unshift(f.key))).toEqual(expected);
  });

  test('every finding and the result pass the shared zod schema', () => {
    const res = verify(crowded(11, 300));
    expect(res.findings.length).toBeGreaterThan(20);
    for (const f of res.findings) expect(() => findingSchema.parse(f)).not.toThrow();
    expect(() => checkResultSchema.parse(res)).not.toThrow();
    // and survives JSON (what the CLI and the API send)
    expect(JSON.parse(JSON.stringify(res.findings))).toEqual(res.findings);
  });

  test('the worker entry point gives the same result as a direct call, also after a structured clone', () => {
    const input = crowded(3, 150);
    const direct = verify(input).findings;
    expect(runVerifyTask({ input }).findings).toEqual(direct);
    expect(runVerifyTask(structuredClone({ input })).findings).toEqual(direct);
  });
});

describe('bounded output', () => {
  test('limit keeps the first findings in report order and counts all of them', () => {
    const input = crowded(5, 400);
    const all = verify(input);
    const some = verify(input, { limit: 7 });
    expect(some.findings).toHaveLength(7);
    expect(some.summary.truncated).toBe(true);
    expect(all.summary.truncated).toBe(false);
    expect(some.summary.errors).toBe(all.summary.errors);
    expect(some.summary.warnings).toBe(all.summary.warnings);
    expect(all.summary.errors + all.summary.warnings).toBe(all.findings.length);
    // per kind, the kept ones are found first; the first 7 overall are errors of the leading kinds
    expect(some.findings.every((f) => f.severity === 'error')).toBe(true);
  });

  test('a pathological pile of parts stays bounded', () => {
    // 2,000 identical bodies on one spot: 1,999,000 overlapping pairs
    const parts: PartSpec[] = Array.from({ length: 2000 }, (_, i) => ({ ref: `R${i + 1}`, x: 0, y: 0, length: 1, width: 1 }));
    const res = verify(makeVerifyInput(parts), { limit: 500 });
    expect(res.findings).toHaveLength(500);
    expect(res.summary.byKind['body-overlap']).toBe((2000 * 1999) / 2);
    expect(res.summary.truncated).toBe(true);
  });

  test('summary counts the placements of the sides checked', () => {
    const input = crowded(2, 200);
    const top = Array.from(input.side).filter((s) => s === 0).length;
    expect(verify(input, { sides: 'top' }).summary.placements).toBe(top);
    expect(verify(input, { sides: 'bottom' }).summary.placements).toBe(200 - top);
    expect(verify(input, { sides: 'top' }).findings.every((f) => f.side === 'top')).toBe(true);
  });
});

describe('misuse errors name what was expected', () => {
  test.each([
    ['an array of the wrong length', (i: VerifyInput) => (i.cx = new Float64Array(1)), 'cx has 1 values, expected 2 (count)'],
    ['a NaN size', (i: VerifyInput) => (i.length[1] = NaN), 'length[1] (R2) is NaN, expected a finite number ≥ 0'],
    ['a bad side code', (i: VerifyInput) => (i.side[0] = 3), 'side[0] (R1) is 3, expected 0 (top) or 1 (bottom)'],
    ['a board outline with 6 numbers', (i: VerifyInput) => (i.boards = [{ board: 1, side: 'top', corners: [0, 0, 1, 0, 1, 1] as never }]), 'boards[0] (board 1, top) has 6 corner numbers, expected 8'],
  ])('%s', (_name, spoil, message) => {
    const input = makeVerifyInput([
      { ref: 'R1', x: 0, y: 0, length: 1, width: 1 },
      { ref: 'R2', x: 5, y: 0, length: 1, width: 1 },
    ]);
    spoil(input);
    expect(() => verify(input)).toThrow(VerifyInputError);
    expect(() => verify(input)).toThrow(message);
  });

  test('a bad sides option', () => {
    expect(() => verify(makeVerifyInput([]), { sides: 'left' as never })).toThrow('sides must be top, bottom or both, got "left"');
  });
});

function permute(input: VerifyInput, perm: number[]): VerifyInput {
  const pick = <T extends { [k: number]: unknown; length: number }>(a: T, make: (n: number) => T): T => {
    const out = make(a.length);
    perm.forEach((from, to) => ((out as Record<number, unknown>)[to] = a[from]));
    return out;
  };
  const f64 = (n: number) => new Float64Array(n);
  const u8 = (n: number) => new Uint8Array(n);
  return {
    ...input,
    ref: pick(input.ref, (n) => new Array(n)),
    board: pick(input.board, (n) => new Int32Array(n)),
    side: pick(input.side, u8),
    cx: pick(input.cx, f64),
    cy: pick(input.cy, f64),
    angleDeg: pick(input.angleDeg, f64),
    length: pick(input.length, f64),
    width: pick(input.width, f64),
    height: pick(input.height, f64),
    courtyard: pick(input.courtyard, f64),
    holderRadius: pick(input.holderRadius, f64),
    overhang: pick(input.overhang, u8),
    hasPackage: pick(input.hasPackage, u8),
    hasNozzle: pick(input.hasNozzle, u8),
    footprint: input.footprint && pick(input.footprint, (n) => new Array(n)),
    packageName: input.packageName && pick(input.packageName, (n) => new Array(n)),
  };
}
