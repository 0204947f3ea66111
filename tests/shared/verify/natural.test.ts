// Natural order of references ("R2 before R10", shared/README.md "Findings") and of "BOARD:REF" strings.
import { describe, expect, test } from 'vitest';
import { compareBoardRefs, compareRefs } from '../../../shared/verify/natural';

describe('natural reference order', () => {
  test.each([
    ['R2', 'R10', -1],
    ['R10', 'R2', 1],
    ['C1', 'C1A', -1],
    ['C1A', 'C2', -1],
    ['C9', 'R1', -1],
    ['r1', 'R2', -1],
    ['U007', 'U7', 1], // same value: fewer leading zeros first
    ['U1', 'U1', 0],
    ['LED12', 'LED3', 1],
    ['X99999999999999999999', 'X100000000000000000000', -1], // beyond 2^53: compared as digits
  ])('%s vs %s → %i', (a, b, sign) => {
    expect(Math.sign(compareRefs(a, b))).toBe(sign);
  });

  test('sorting a list', () => {
    const refs = ['R10', 'C2', 'R2', 'R1', 'C10', 'C1', 'U1', 'R100', 'R20'];
    expect([...refs].sort(compareRefs)).toEqual(['C1', 'C2', 'C10', 'R1', 'R2', 'R10', 'R20', 'R100', 'U1']);
  });

  test('board number first, numerically (2 before 10), then the reference', () => {
    const items: [number, string][] = [[10, 'A1'], [2, 'R10'], [2, 'R2'], [1, 'Z9']];
    items.sort((a, b) => compareBoardRefs(a[0], a[1], b[0], b[1]));
    expect(items.map(([b, r]) => `${b}:${r}`)).toEqual(['1:Z9', '2:R2', '2:R10', '10:A1']);
  });
});

describe('natural keys agree with compareRefs', () => {
  test('sortRefsNatural = sort(compareRefs) on random references (property)', async () => {
    const fc = (await import('fast-check')).default;
    const { sortRefsNatural } = await import('../../../shared/verify/natural');
    const part = fc.oneof(
      fc.constantFrom('R', 'C', 'U', 'r', 'LED', 'J', '-', '_', 'A', 'b'),
      fc.integer({ min: 0, max: 20000 }).map(String),
      fc.constantFrom('0', '007', '00', '10', '9'),
    );
    const ref = fc.array(part, { minLength: 1, maxLength: 5 }).map((p) => p.join(''));
    fc.assert(
      fc.property(fc.uniqueArray(ref, { maxLength: 40 }), (refs) => {
        expect(sortRefsNatural(refs)).toEqual([...refs].sort(compareRefs));
      }),
      { numRuns: 500 },
    );
  });

  test('the letters-then-number fast path = sort(compareRefs), case variants included (property)', async () => {
    const fc = (await import('fast-check')).default;
    const { sortRefsNatural } = await import('../../../shared/verify/natural');
    // designator shapes of the trade (R12, C3, LED1, TP40, FID2) with upper- and lower-case letters
    const ref = fc
      .tuple(fc.constantFrom('R', 'C', 'c', 'U', 'LED', 'Led', 'TP', 'T', 'FID', 'Q', 'q', 'J', 'JP'), fc.integer({ min: 0, max: 999_999_999 }))
      .map(([p, k]) => `${p}${k}`);
    fc.assert(
      fc.property(fc.uniqueArray(ref, { maxLength: 60 }), (refs) => {
        expect(sortRefsNatural(refs)).toEqual([...refs].sort(compareRefs));
      }),
      { numRuns: 500 },
    );
  });
});
