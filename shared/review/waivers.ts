// Which waiver covers which finding. A waiver is either for one finding (its key) or for every
// board: the same kind on the same references wherever the panel repeats the board, including
// boards added later to that revision. Shared by the server (release blocking, summaries) and
// the client (the Verify and Release stages), so both count open errors the same way.
import type { Finding } from '../schemas/finding.schema';

export const WAIVER_SCOPES = ['finding', 'every-board'] as const;
export type WaiverScope = (typeof WAIVER_SCOPES)[number];

/** What a waiver needs to be matched: its key and its scope. */
export interface WaiverLike {
  findingKey: string;
  scope?: WaiverScope | string;
}

/** Marks the board number in an every-board key ("body-overlap|*:R1|*:R2"). */
export const ANY_BOARD = '*';

/**
 * The every-board key of a finding: its kind and its references with the board number replaced
 * by `*`. Only a finding whose references all lie on one board repeats per board; a finding
 * between boards (or about whole boards or the panel) has none, and null is returned.
 */
export function everyBoardKey(f: Pick<Finding, 'kind' | 'refs' | 'boards'>): string | null {
  if (f.refs.length === 0 || f.boards.length !== 1) return null;
  const prefix = `${f.boards[0]}:`;
  const refs: string[] = [];
  for (const r of f.refs) {
    if (!r.startsWith(prefix)) return null;
    refs.push(`${ANY_BOARD}:${r.slice(prefix.length)}`);
  }
  return `${f.kind}|${refs.join('|')}`;
}

/**
 * The every-board key of a finding known only by its key ("kind|BOARD:REF|…"), e.g. a waived
 * finding that the last check no longer reports; null when its refs are not all on one board.
 */
export function everyBoardKeyOfKey(key: string): string | null {
  const [kind, ...refs] = key.split('|');
  const boards = new Set<number>();
  for (const r of refs) {
    const m = /^(\d+):/.exec(r);
    if (!m) return null;
    boards.add(Number(m[1]));
  }
  return refs.length > 0 && boards.size === 1 ? everyBoardKey({ kind: kind as Finding['kind'], refs, boards: [...boards] }) : null;
}

/** The references of an every-board key without the board ("R1", "R2"). */
export function everyBoardRefs(key: string): string[] {
  return key
    .split('|')
    .slice(1)
    .map((r) => (r.startsWith(`${ANY_BOARD}:`) ? r.slice(ANY_BOARD.length + 1) : r));
}

/**
 * A lookup from finding to the waiver that covers it: a waiver of that very finding first, else
 * an every-board waiver of its kind and references.
 */
export function waiverLookup<W extends WaiverLike>(waivers: readonly W[]): (f: Pick<Finding, 'key' | 'kind' | 'refs' | 'boards'>) => W | undefined {
  const exact = new Map<string, W>();
  const everyBoard = new Map<string, W>();
  for (const w of waivers) (w.scope === 'every-board' ? everyBoard : exact).set(w.findingKey, w);
  return (f) => {
    const hit = exact.get(f.key);
    if (hit || everyBoard.size === 0) return hit;
    const k = everyBoardKey(f);
    return k === null ? undefined : everyBoard.get(k);
  };
}

/** The keys of the findings some waiver covers. */
export function waivedKeys(findings: readonly Finding[], waivers: readonly WaiverLike[]): Set<string> {
  const lookup = waiverLookup(waivers);
  const out = new Set<string>();
  for (const f of findings) if (lookup(f)) out.add(f.key);
  return out;
}

/** How many of the findings each waiver covers. */
export function coverCounts(findings: readonly Finding[], waivers: readonly WaiverLike[]): Map<WaiverLike, number> {
  const lookup = waiverLookup(waivers);
  const out = new Map<WaiverLike, number>(waivers.map((w) => [w, 0]));
  for (const f of findings) {
    const w = lookup(f);
    if (w) out.set(w, (out.get(w) ?? 0) + 1);
  }
  return out;
}

/**
 * Findings that repeat per board, grouped by every-board key, for the groups seen on two or more
 * boards: what "waive on every board" is offered for.
 */
export function repeatedFindings(findings: readonly Finding[]): Map<string, Finding[]> {
  const groups = new Map<string, Finding[]>();
  for (const f of findings) {
    const k = everyBoardKey(f);
    if (k === null) continue;
    const g = groups.get(k);
    if (g) g.push(f);
    else groups.set(k, [f]);
  }
  for (const [k, g] of groups) if (g.length < 2) groups.delete(k);
  return groups;
}
