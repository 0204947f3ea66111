import { describe, expect, test } from 'vitest';
import { angleText, byteSizeText, fixed, fixed3, lengthText } from '../../../shared/core';

describe('the one formatter of lengths and angles', () => {
  test.each([
    [0, '0.000'],
    [-0, '0.000'],
    [-0.0004, '0.000'], // rounds to zero: no sign
    [-0.0005, '-0.001'], // half away from zero
    [0.0005, '0.001'],
    [12.7, '12.700'],
    [-3.14159, '-3.142'],
    [1.0005, '1.001'],
    [359.9996, '360.000'],
  ])('fixed3(%s) = %s', (v, want) => {
    expect(fixed3(v)).toBe(want);
    expect(fixed(v)).toBe(want);
  });
  test('other decimals, never a negative zero', () => {
    expect(fixed(-0.004, 2)).toBe('0.00');
    expect(fixed(-0.4, 0)).toBe('0');
    expect(fixed(2.5, 0)).toBe('3');
    expect(fixed(-2.5, 0)).toBe('-3');
    expect(fixed(0.01234, 4)).toBe('0.0123');
    expect(fixed(1234567.891, 1)).toBe('1234567.9');
    expect(() => fixed(1, 9)).toThrow(/0–6/);
  });
  test('with units; nothing to show is a dash', () => {
    expect(lengthText(-0.0001)).toBe('0.000 mm');
    expect(lengthText(25.4)).toBe('25.400 mm');
    expect(lengthText(400, 0)).toBe('400 mm');
    expect(angleText(-90)).toBe('-90.000°');
    expect(lengthText(null)).toBe('—');
    expect(angleText(Number.NaN)).toBe('—');
  });
  test('matches toFixed wherever toFixed has no negative zero (property over many values)', () => {
    for (let k = 0; k < 20000; k++) {
      const v = (k - 10000) * 0.0137 + 0.00049;
      const want = v.toFixed(3);
      expect(fixed3(v)).toBe(want === '-0.000' ? '0.000' : want);
    }
  });
});

test('sizes in decimal units (SI prefixes, 1 kB = 1000 bytes), as the body-too-large message writes them', () => {
  expect([999, 1000, 41_234, 999_949, 1_048_576, -1].map(byteSizeText)).toEqual(['999 B', '1.0 kB', '41.2 kB', '999.9 kB', '1.0 MB', '—']);
});
