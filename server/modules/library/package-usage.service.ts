// Where a package is used: the program revisions (in work and released) whose parts it places,
// shown before a shared package is changed. Matching is the engine's: the footprint through names,
// aliases and patterns, or a part's override naming the package.
import { In, type DataSource } from 'typeorm';
import { PackageMatcher } from '../../../shared/library';
import type { ImportResult } from '../../../shared/core';
import type { PackageUsage } from '../../../shared/schemas/library.schema';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { Program, ProgramRevision } from '../../db/entities/program.entity';
import { NotFoundError } from '../../lib/errors';
import { getLibraryFile } from './library.service';

/** How many references of each revision are listed by name. */
const REFS_SHOWN = 12;
const natural = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

export async function packageUsage(ds: DataSource, packageId: string): Promise<PackageUsage> {
  const pkg = await ds.getRepository(LibraryPackage).findOneBy({ id: packageId });
  if (!pkg) throw new NotFoundError('The package');
  const library = await getLibraryFile(ds.manager);
  const matcher = new PackageMatcher(library.packages);
  // an override names its package; names compare without case or surrounding spaces, first one wins
  const byName = new Map<string, (typeof library.packages)[number]>();
  for (const p of library.packages) if (!byName.has(p.name.trim().toLowerCase())) byName.set(p.name.trim().toLowerCase(), p);
  const target = pkg.name.toLowerCase();
  const revisions = await ds.getRepository(ProgramRevision).find({
    where: { state: In(['draft', 'in-review', 'released']) },
    select: { id: true, programId: true, label: true, state: true, imported: true, overrides: true },
  });
  const programs = new Map((await ds.getRepository(Program).findBy({ id: In([...new Set(revisions.map((r) => r.programId)), '00000000-0000-0000-0000-000000000000']) })).map((p) => [p.id, p]));
  const items: PackageUsage['revisions'] = [];
  for (const r of revisions) {
    const imported = r.imported as unknown as ImportResult | null;
    if (!imported) continue;
    const overrides = r.overrides as Record<string, { package?: string }>;
    const refs = new Set<string>();
    let viaOverride = 0;
    for (const p of imported.placements) {
      if (p.dnp || refs.has(p.ref)) continue;
      const o = Object.prototype.hasOwnProperty.call(overrides, p.ref) ? overrides[p.ref] : undefined;
      const byOverride = o?.package !== undefined ? (byName.get(o.package.trim().toLowerCase()) ?? null) : null;
      const used = byOverride ?? matcher.match(p.footprint).pkg;
      if (used?.name.toLowerCase() !== target) continue;
      refs.add(p.ref);
      if (byOverride) viaOverride++;
    }
    if (refs.size === 0) continue;
    const program = programs.get(r.programId);
    items.push({
      programId: r.programId,
      programName: program?.name ?? '(deleted program)',
      revisionId: r.id,
      label: r.label,
      state: r.state as 'draft' | 'in-review' | 'released',
      parts: refs.size,
      viaOverride,
      refs: [...refs].sort(natural.compare).slice(0, REFS_SHOWN),
      affected: r.state !== 'released',
    });
  }
  items.sort((a, b) => Number(b.affected) - Number(a.affected) || natural.compare(a.programName, b.programName) || natural.compare(a.label, b.label));
  return { packageId: pkg.id, packageName: pkg.name, revisions: items, inWork: items.filter((i) => i.affected).length, released: items.filter((i) => !i.affected).length };
}
