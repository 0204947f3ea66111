// Library matching and assignment: footprint → package → nozzle and vision preset, with the
// job's per-part overrides applied here, before the placements are built (see README.md here).
import type { LibraryFile, LibraryNozzle, LibraryPackage, LibraryVisionPreset } from '../schemas/library-file.schema';
import type { PartOverride } from '../schemas/job.schema';

/** Courtyard excess when a package gives none, mm: IPC-7351B density level B, from memory. */
export const DEFAULT_COURTYARD = 0.25;

/**
 * The one rule for comparing names of library things (packages, aliases, nozzles, vision
 * presets, the machine's nozzle list, overrides): surrounding spaces are ignored and so is
 * letter case ("N08", " n08" and "N08 " name the same nozzle). Output always carries the name as
 * the library spells it.
 */
export function nameKey(name: string): string {
  return name.trim().toLowerCase();
}

/** How a footprint matched a package (null: it did not). */
export type MatchedBy = 'name' | 'alias' | 'pattern' | null;

/** What a footprint resolves to; shared by every placement with that footprint. */
export interface Assignment {
  pkg: LibraryPackage | null;
  /** how it matched */
  matchedBy: MatchedBy | 'override';
  nozzle: string | null;
  holderRadius: number | null;
  /** the nozzle tip's outer diameter, mm (null: no nozzle, or one the library does not list) */
  tipOuter: number | null;
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
  private readonly cache = new Map<string, { pkg: LibraryPackage | null; by: MatchedBy }>();

  constructor(packages: readonly LibraryPackage[]) {
    let order = 0;
    for (const p of packages) {
      const k = nameKey(p.name);
      if (!this.byName.has(k)) this.byName.set(k, p);
      for (const a of p.aliases) {
        if (a.includes('*') || a.includes('?')) {
          this.patterns.push({ re: globToRegExp(a), len: a.length, order: order++, pkg: p });
        } else {
          const ak = nameKey(a);
          if (!this.byAlias.has(ak)) this.byAlias.set(ak, p);
        }
      }
    }
    this.patterns.sort((a, b) => b.len - a.len || a.order - b.order);
  }

  match(footprint: string): { pkg: LibraryPackage | null; by: MatchedBy } {
    const hit = this.cache.get(footprint);
    if (hit) return hit;
    const k = nameKey(footprint);
    let r: { pkg: LibraryPackage | null; by: MatchedBy } = { pkg: null, by: null };
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

  /** The package of that name (the name rule of `nameKey`; aliases do not count), or null. */
  byPackageName(name: string): LibraryPackage | null {
    return this.byName.get(nameKey(name)) ?? null;
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
  const onMachine = machineNozzles ? new Set(machineNozzles.map(nameKey)) : null;
  if (pkg.nozzles.length > 0) {
    if (!onMachine) return pkg.nozzles[0];
    for (const n of pkg.nozzles) if (onMachine.has(nameKey(n))) return n;
    return null;
  }
  const pool = onMachine && onMachine.size
    ? libraryNozzles.filter((n) => onMachine.has(nameKey(n.name)))
    : libraryNozzles;
  const limit = Math.min(pkg.body.length, pkg.body.width);
  let best: LibraryNozzle | null = null;
  for (const n of pool) {
    if (n.tipOuter <= limit + 1e-9 && (!best || n.tipOuter > best.tipOuter)) best = n;
  }
  return best ? best.name : null;
}

/** Why an override could not be applied as written (the part keeps the engine's own choice). */
export interface OverrideProblem {
  ref: string;
  field: 'package' | 'nozzle' | 'vision';
  message: string;
}

/**
 * Library + machine (+ the job's overrides) → assignments. Without an override a part's
 * assignment depends only on its footprint and is cached per footprint; an overridden part is
 * assigned on its own:
 * - `package`: the package of that name (name rule of `nameKey`; aliases and patterns do not
 *   count) replaces the footprint match; its body, rotation offset, nozzle list and preset follow.
 * - `nozzle`: that library nozzle replaces the chosen one (its holder radius follows).
 * - `vision`: that library preset replaces the package's one.
 * A name the library does not know is reported (`problems`) and leaves the part as matched.
 */
export class Assigner {
  private readonly matcher: PackageMatcher;
  private readonly nozzles = new Map<string, LibraryNozzle>();
  private readonly presets = new Map<string, LibraryVisionPreset>();
  private readonly cache = new Map<string, Assignment>();
  readonly problems: OverrideProblem[] = [];

  constructor(
    private readonly library: LibraryFile | null,
    private readonly machineNozzles: readonly string[] | null,
    private readonly overrides: Readonly<Record<string, PartOverride>> = {},
  ) {
    this.matcher = new PackageMatcher(library?.packages ?? []);
    for (const n of library?.nozzles ?? []) if (!this.nozzles.has(nameKey(n.name))) this.nozzles.set(nameKey(n.name), n);
    for (const v of library?.visionPresets ?? []) if (!this.presets.has(nameKey(v.name))) this.presets.set(nameKey(v.name), v);
  }

  /** true when the job overrides anything */
  get hasOverrides(): boolean {
    for (const _ in this.overrides) return true;
    return false;
  }

  private forPackage(pkg: LibraryPackage | null, by: Assignment['matchedBy']): Assignment {
    if (!pkg) return { pkg: null, matchedBy: null, nozzle: null, holderRadius: null, tipOuter: null, vision: null };
    const chosen = chooseNozzle(pkg, this.library?.nozzles ?? [], this.machineNozzles);
    const n = chosen ? this.nozzles.get(nameKey(chosen)) : undefined;
    return { pkg, matchedBy: by, nozzle: n ? n.name : chosen, holderRadius: n ? n.holderRadius : null, tipOuter: n ? n.tipOuter : null, vision: pkg.vision ?? null };
  }

  /** The assignment of a footprint, ignoring overrides. */
  assign(footprint: string): Assignment {
    const hit = this.cache.get(footprint);
    if (hit) return hit;
    const { pkg, by } = this.matcher.match(footprint);
    const a = this.forPackage(pkg, by);
    this.cache.set(footprint, a);
    return a;
  }

  /** The assignment of one part: its footprint's, with the part's override applied. */
  assignPart(ref: string, footprint: string): Assignment {
    const o = Object.prototype.hasOwnProperty.call(this.overrides, ref) ? this.overrides[ref] : undefined;
    if (!o) return this.assign(footprint);
    let a = this.assign(footprint);
    if (o.package !== undefined) {
      const pkg = this.matcher.byPackageName(o.package);
      if (pkg) a = this.forPackage(pkg, 'override');
      else this.problems.push({ ref, field: 'package', message: `override of ${ref}: no package named "${o.package}" in the library; the footprint's match is kept` });
    }
    if (o.nozzle !== undefined) {
      const n = this.nozzles.get(nameKey(o.nozzle));
      if (n) a = { ...a, nozzle: n.name, holderRadius: n.holderRadius, tipOuter: n.tipOuter };
      else this.problems.push({ ref, field: 'nozzle', message: `override of ${ref}: no nozzle named "${o.nozzle}" in the library; the chosen nozzle is kept` });
    }
    if (o.vision !== undefined) {
      const v = this.presets.get(nameKey(o.vision));
      if (v) a = { ...a, vision: v.name };
      else this.problems.push({ ref, field: 'vision', message: `override of ${ref}: no vision preset named "${o.vision}" in the library; the package's preset is kept` });
    }
    return a;
  }
}

/**
 * Footprints of an import that no package matches, counted per centroid row (do-not-place rows
 * left out), by the rules a run assigns with (overrides included): what the library's
 * unmatched-footprints queue records when a file is imported.
 */
export function unmatchedFootprints(
  placements: readonly { ref: string; footprint: string; dnp: boolean }[],
  library: LibraryFile | null,
  overrides: Readonly<Record<string, PartOverride>> = {},
): { footprint: string; count: number }[] {
  const assigner = new Assigner(library, null, overrides);
  const counts = new Map<string, number>();
  for (const p of placements) {
    if (p.dnp || assigner.assignPart(p.ref, p.footprint).pkg) continue;
    counts.set(p.footprint, (counts.get(p.footprint) ?? 0) + 1);
  }
  return [...counts].map(([footprint, count]) => ({ footprint, count }));
}
