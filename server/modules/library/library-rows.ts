// Reading the whole library at once: its rows, the engine's LibraryFile made from them, and the
// unmatched footprints the library now matches.
import type { EntityManager } from 'typeorm';
import { IsNull } from 'typeorm';
import { PackageMatcher } from '../../../shared/library';
import { libraryFileSchema, type LibraryFile } from '../../../shared/schemas/library-file.schema';
import { LibraryAlias } from '../../db/entities/library-alias.entity';
import { LibraryMachine } from '../../db/entities/library-machine.entity';
import { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { LibraryUnmatchedFootprint } from '../../db/entities/library-unmatched.entity';
import { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import { toLibraryFileObject, type LibraryRows } from './library-file';

export async function loadLibraryRows(m: EntityManager): Promise<LibraryRows> {
  const [packages, aliases, nozzles, presets, machines] = await Promise.all([
    m.getRepository(LibraryPackage).find(),
    m.getRepository(LibraryAlias).find(),
    m.getRepository(LibraryNozzle).find(),
    m.getRepository(LibraryVisionPreset).find(),
    m.getRepository(LibraryMachine).find(),
  ]);
  return { packages, aliases, nozzles, presets, machines };
}

/**
 * The library as the engine's LibraryFile (shared/schemas/README.md, "Library file"): what the programs module hands
 * to shared/pipeline. Pass the transaction's manager to read inside it.
 */
export async function getLibraryFile(manager: EntityManager): Promise<LibraryFile> {
  return libraryFileSchema.parse(toLibraryFileObject(await loadLibraryRows(manager)));
}

/** Marks open unmatched footprints that the library now matches as resolved. */
export async function resolveNowMatched(m: EntityManager, by: string | null): Promise<number> {
  const open = await m.getRepository(LibraryUnmatchedFootprint).find({ where: { resolvedAt: IsNull() } });
  if (open.length === 0) return 0;
  const file = await getLibraryFile(m);
  const matcher = new PackageMatcher(file.packages);
  let n = 0;
  for (const u of open) {
    const hit = matcher.match(u.footprint);
    if (!hit.pkg) continue;
    await m.query('UPDATE "library_unmatched_footprints" SET "resolved_at" = now(), "resolved_package" = $2, "resolved_by" = $3 WHERE "id" = $1', [u.id, hit.pkg.name, by]);
    n++;
  }
  return n;
}
