import type { FindingKind } from '../../../../shared/schemas/finding.schema';

/** What each kind of finding is called on screen: every kind has a label (a new kind does not compile without one). */
export const FINDING_KIND_LABELS: Record<FindingKind, string> = {
  'body-overlap': 'Bodies overlap',
  'courtyard-overlap': 'Courtyards overlap',
  'off-board': 'Part off its board',
  'board-overlap': 'Boards overlap',
  'off-panel': 'Board off the panel',
  'fiducial-clearance': 'Part in a fiducial’s clear area',
  'nozzle-shadow': 'Taller neighbour near the nozzle',
  'nozzle-size': 'Nozzle wider than the part',
  'out-of-reach': 'Out of the machine’s reach',
  'no-package': 'No package',
  'no-nozzle': 'No nozzle on the machine',
};

export const findingKindLabel = (kind: string) => FINDING_KIND_LABELS[kind as FindingKind] ?? kind;

/** What a waiver's key names, for people: "1:R1, 1:R2", "boards 1, 2" or "the panel". */
export function waivedWhat(refs: readonly string[]): string {
  return refs.map((r) => (r.startsWith('boards:') ? `boards ${r.slice('boards:'.length).split(',').join(', ')}` : r === 'panel' ? 'the panel' : r)).join(', ');
}
