// Library matching and assignment (CLI.md "Library file" and "Panel and list").
import type { LibraryFile, LibraryNozzle, LibraryPackage } from '../schemas/library-file.schema';

export const DEFAULT_COURTYARD = 0.25;

/** What a footprint resolves to; shared by every placement with that footprint. */
export interface Assignment {
  pkg: LibraryPackage | null;
  /** how it matched */
  matchedBy: 'name' | 'alias' | 'pattern' | null;
  nozzle: string | null;
  holderRadius: number | null;
  vision: string | null;
}

function globToRegExp(glob: string): RegExp {
  let re = '^';
  for (const ch of glob) {
    if (ch === '*') re += '.*';
    else if (ch === '?') re += '.';
    else re += ch.replace(/[.+^${}()|[\]\\]/g, '\\$&');
  }
  return new RegExp(re + '$', 'i');
}

/**
 * Footprint → package. Case-insensitive, first hit wins: a package name equal to the footprint;
 * an alias equal to it; an alias pattern (`*`, `?`), the longest pattern first (ties: library
 * order). Results are cached per footprint string.
 */
export class PackageMatcher {
  private readonly byName = new Map<string, LibraryPackage>();
  private readonly byAlias = new Map<string, LibraryPackage>();
  private readonly patterns: { re: RegExp; len: number; order: number; pkg: LibraryPackage }[] = [];
  private readonly cache = new Map<string, { pkg: LibraryPackage | null; by: Assignment['matchedBy'] }>();

  constructor(packages: readonly LibraryPackage[]) {
    let order = 0;
    for (const p of packages) {
      const k = p.name.toLowerCase();
      if (!this.byName.has(k)) this.byName.set(k, p);
      for (const a of p.aliases) {
        if (a.includes('*') || a.includes('?')) {
          this.patterns.push({ re: globToRegExp(a), len: a.length, order: order++, pkg: p });
        } else {
          const ak = a.toLowerCase();
          if (!this.byAlias.has(ak)) this.byAlias.set(ak, p);
        }
      }
    }
    this.patterns.sort((a, b) => b.len - a.len || a.order - b.order);
  }

  match(footprint: string): { pkg: LibraryPackage | null; by: Assignment['matchedBy'] } {
    const hit = this.cache.get(footprint);
    if (hit) return hit;
    const k = footprint.trim().toLowerCase();
    let r: { pkg: LibraryPackage | null; by: Assignment['matchedBy'] } = { pkg: null, by: null };
    if (k !== '') {
      const n = this.byName.get(k);
      if (n) r = { pkg: n, by: 'name' };
      else {
        const a = this.byAlias.get(k);
        if (a) r = { pkg: a, by: 'alias' };
        else {
          for (const p of this.patterns) {
            if (p.re.test(k)) {
              r = { pkg: p.pkg, by: 'pattern' };
              break;
            }
          }
        }
      }
    }
    this.cache.set(footprint, r);
    return r;
  }
}

/**
 * Nozzle choice: the first of the package's nozzles that the machine has (without a machine: the
 * first listed); a package without a list gets the largest tip (of the machine's nozzles, else the
 * library's) whose outer diameter is not larger than the body's smaller side.
 */
export function chooseNozzle(
  pkg: LibraryPackage,
  libraryNozzles: readonly LibraryNozzle[],
  machineNozzles: readonly string[] | null,
): string | null {
  if (pkg.nozzles.length > 0) {
    if (!machineNozzles) return pkg.nozzles[0];
    for (const n of pkg.nozzles) if (machineNozzles.includes(n)) return n;
    return null;
  }
  const pool = machineNozzles && machineNozzles.length
    ? libraryNozzles.filter((n) => machineNozzles.includes(n.name))
    : libraryNozzles;
  const limit = Math.min(pkg.body.length, pkg.body.width);
  let best: LibraryNozzle | null = null;
  for (const n of pool) {
    if (n.tipOuter <= limit + 1e-9 && (!best || n.tipOuter > best.tipOuter)) best = n;
  }
  return best ? best.name : null;
}

/** Library + machine → per-footprint assignments (cached). */
export class Assigner {
  private readonly matcher: PackageMatcher;
  private readonly nozzles = new Map<string, LibraryNozzle>();
  private readonly cache = new Map<string, Assignment>();

  constructor(
    private readonly library: LibraryFile | null,
    private readonly machineNozzles: readonly string[] | null,
  ) {
    this.matcher = new PackageMatcher(library?.packages ?? []);
    for (const n of library?.nozzles ?? []) this.nozzles.set(n.name, n);
  }

  assign(footprint: string): Assignment {
    const hit = this.cache.get(footprint);
    if (hit) return hit;
    const { pkg, by } = this.matcher.match(footprint);
    let a: Assignment;
    if (!pkg) a = { pkg: null, matchedBy: null, nozzle: null, holderRadius: null, vision: null };
    else {
      const nozzle = chooseNozzle(pkg, this.library?.nozzles ?? [], this.machineNozzles);
      a = {
        pkg,
        matchedBy: by,
        nozzle,
        holderRadius: nozzle ? (this.nozzles.get(nozzle)?.holderRadius ?? null) : null,
        vision: pkg.vision ?? null,
      };
    }
    this.cache.set(footprint, a);
    return a;
  }
}
