import type { SetupSheetList, SetupSheetPlacement } from '../../../../shared/schemas/run-file.schema';

/** One line of the set-up sheet's parts table: the parts of one package and value on one side. */
export interface PartGroup {
  package: string;
  value: string;
  /** distinct part numbers, sorted */
  partNumbers: string[];
  nozzle: string | null;
  vision: string | null;
  /** placements of this group on the whole panel */
  perPanel: number;
  /** placements on each board that carries this group: one number when every board has the same */
  perBoard: { min: number; max: number };
  /** reference designators on board 1 (or the lowest board that has the group), natural order */
  refs: string[];
}

export interface Tally {
  name: string;
  count: number;
}

const NO_PACKAGE = '(no package)';
const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
const byName = (a: string, b: string) => collator.compare(a, b);

/**
 * Groups a side's placements by package and value. Per-board counts come from the placements'
 * board numbers, so a board that was skipped does not count and a group present on only some
 * boards shows its range.
 */
export function groupParts(placements: readonly SetupSheetPlacement[]): PartGroup[] {
  const groups = new Map<string, { pkg: string; value: string; pns: Set<string>; nozzles: Set<string>; vision: Set<string>; boards: Map<number, string[]>; n: number }>();
  for (const p of placements) {
    const pkg = p.package || NO_PACKAGE;
    const key = `${pkg}\u0000${p.value}`;
    let g = groups.get(key);
    if (!g) {
      g = { pkg, value: p.value, pns: new Set(), nozzles: new Set(), vision: new Set(), boards: new Map(), n: 0 };
      groups.set(key, g);
    }
    g.n += 1;
    if (p.partNumber) g.pns.add(p.partNumber);
    if (p.nozzle) g.nozzles.add(p.nozzle);
    if (p.vision) g.vision.add(p.vision);
    const refs = g.boards.get(p.board);
    if (refs) refs.push(p.ref);
    else g.boards.set(p.board, [p.ref]);
  }
  return [...groups.values()]
    .map((g) => {
      const counts = [...g.boards.values()].map((r) => r.length);
      const firstBoard = Math.min(...g.boards.keys());
      return {
        package: g.pkg,
        value: g.value,
        partNumbers: [...g.pns].sort(byName),
        nozzle: [...g.nozzles].sort(byName).join(', ') || null,
        vision: [...g.vision].sort(byName).join(', ') || null,
        perPanel: g.n,
        perBoard: { min: Math.min(...counts), max: Math.max(...counts) },
        refs: [...new Set(g.boards.get(firstBoard))].sort(byName),
      };
    })
    .sort((a, b) => byName(a.package, b.package) || byName(a.value, b.value));
}

function tally(values: (string | null)[]): Tally[] {
  const m = new Map<string, number>();
  for (const v of values) if (v) m.set(v, (m.get(v) ?? 0) + 1);
  return [...m].map(([name, count]) => ({ name, count })).sort((a, b) => byName(a.name, b.name));
}

/** Placements per nozzle on the panel (parts without a nozzle are not counted). */
export const nozzleCounts = (placements: readonly SetupSheetPlacement[]) => tally(placements.map((p) => p.nozzle));

/** Placements per vision preset on the panel. */
export const visionCounts = (placements: readonly SetupSheetPlacement[]) => tally(placements.map((p) => p.vision));

/** Boards that carry at least one placement of this side. */
export const boardsOf = (list: SetupSheetList) => new Set(list.placements.map((p) => p.board)).size || list.meta.boards;

export function perBoardText(g: Pick<PartGroup, 'perBoard'>): string {
  return g.perBoard.min === g.perBoard.max ? String(g.perBoard.min) : `${g.perBoard.min}–${g.perBoard.max}`;
}
