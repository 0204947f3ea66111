// Which waiver covers which finding (shared/review): the rule the server and the client both use.
import { describe, expect, it } from 'vitest';
import { everyBoardKey, everyBoardKeyOfKey, everyBoardRefs, repeatedFindings, waivedKeys, waiverLookup } from '../../shared/review';
import type { Finding } from '../../shared/schemas/finding.schema';

function finding(kind: Finding['kind'], refs: string[], boards?: number[]): Finding {
  const b = boards ?? [...new Set(refs.map((r) => Number(r.split(':')[0])))].sort((x, y) => x - y);
  const key = refs.length ? `${kind}|${refs.join('|')}` : b.length ? `${kind}|boards:${b.join(',')}` : `${kind}|panel`;
  return { key, kind, severity: 'error', side: 'top', board: b[0] ?? null, boards: b, refs, message: key, geometry: { type: 'point', x: 0, y: 0 }, depth: null, distance: null };
}

describe('every-board keys', () => {
  it('replace the board of each reference by *, for findings within one board only', () => {
    expect(everyBoardKey(finding('body-overlap', ['1:R1', '1:R2']))).toBe('body-overlap|*:R1|*:R2');
    expect(everyBoardKey(finding('body-overlap', ['12:R1', '12:R2']))).toBe('body-overlap|*:R1|*:R2');
    expect(everyBoardKey(finding('off-board', ['2:R3']))).toBe('off-board|*:R3');
    // between boards, about whole boards, or the panel: nothing repeats per board
    expect(everyBoardKey(finding('body-overlap', ['1:C1', '2:C5']))).toBeNull();
    expect(everyBoardKey(finding('board-overlap', [], [1, 2]))).toBeNull();
    expect(everyBoardKey(finding('out-of-reach', [], []))).toBeNull();
  });

  it('are also read from a finding key alone, and give back the bare references', () => {
    expect(everyBoardKeyOfKey('body-overlap|3:R1|3:R2')).toBe('body-overlap|*:R1|*:R2');
    expect(everyBoardKeyOfKey('body-overlap|1:C1|2:C5')).toBeNull();
    expect(everyBoardKeyOfKey('board-overlap|boards:1,2')).toBeNull();
    expect(everyBoardKeyOfKey('out-of-reach|panel')).toBeNull();
    expect(everyBoardRefs('body-overlap|*:R1|*:R2')).toEqual(['R1', 'R2']);
  });
});

describe('waiver lookup', () => {
  const f1 = finding('body-overlap', ['1:R1', '1:R2']);
  const f2 = finding('body-overlap', ['2:R1', '2:R2']);
  const f3 = finding('body-overlap', ['3:R1', '3:R2']); // a board added later
  const cross = finding('body-overlap', ['1:R1', '2:R2']); // same kind and names, but between boards
  const other = finding('courtyard-overlap', ['1:R1', '1:R2']); // same refs, another kind

  it('an every-board waiver covers each board’s finding, a later board’s too, and nothing else', () => {
    const every = { findingKey: 'body-overlap|*:R1|*:R2', scope: 'every-board' };
    const of = waiverLookup([every]);
    expect([f1, f2, f3].map(of)).toEqual([every, every, every]);
    expect(of(cross)).toBeUndefined();
    expect(of(other)).toBeUndefined();
    expect(waivedKeys([f1, f2, f3, cross, other], [every])).toEqual(new Set([f1.key, f2.key, f3.key]));
  });

  it('a finding waiver covers its finding only, and is found before an every-board one', () => {
    const one = { findingKey: f1.key, scope: 'finding' };
    const every = { findingKey: 'body-overlap|*:R1|*:R2', scope: 'every-board' };
    expect(waiverLookup([one])(f2)).toBeUndefined();
    expect(waiverLookup([every, one])(f1)).toBe(one);
    // a waiver stored before scopes existed (no scope) is a finding waiver
    expect(waiverLookup([{ findingKey: f2.key }])(f2)).toEqual({ findingKey: f2.key });
  });

  it('offers "every board" only for findings seen on two boards or more', () => {
    const groups = repeatedFindings([f1, f2, cross, other]);
    expect([...groups.keys()]).toEqual(['body-overlap|*:R1|*:R2']);
    expect(groups.get('body-overlap|*:R1|*:R2')).toEqual([f1, f2]);
  });
});
