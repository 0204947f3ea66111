import type { DataSource } from 'typeorm';
import { parseLibraryFile } from '../../modules/library/library-file';
import { LibraryAlias } from '../entities/library-alias.entity';
import { LibraryMachine } from '../entities/library-machine.entity';
import { LibraryNozzle } from '../entities/library-nozzle.entity';
import { LibraryPackage } from '../entities/library-package.entity';
import { LibraryRevision } from '../entities/library-revision.entity';
import { LibraryVisionPreset } from '../entities/library-vision-preset.entity';
import { STARTER_LIBRARY } from './starter-library.data';

export { STARTER_LIBRARY };

/**
 * Seeds the starter library (starter-library.data.ts). Idempotent: adds what is missing by name,
 * leaves what exists (a librarian's edit stays), and never takes an alias another package holds.
 */
export async function seedStarterLibrary(ds: DataSource, log: (s: string) => void = () => {}): Promise<void> {
  const { value, errors } = parseLibraryFile(STARTER_LIBRARY);
  if (errors.length) throw new Error(`starter library: ${errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  await ds.transaction(async (m) => {
    const by = 'starter library';
    const added = { packages: 0, aliases: 0, nozzles: 0, visionPresets: 0, machines: 0 };
    const haveNozzles = new Set((await m.getRepository(LibraryNozzle).find()).map((n) => n.name.toLowerCase()));
    for (const n of value.nozzles) {
      if (haveNozzles.has(n.name.toLowerCase())) continue;
      await m.getRepository(LibraryNozzle).insert({ ...n, updatedBy: by });
      added.nozzles++;
    }
    const havePresets = new Set((await m.getRepository(LibraryVisionPreset).find()).map((n) => n.name.toLowerCase()));
    for (const v of value.presets) {
      if (havePresets.has(v.name.toLowerCase())) continue;
      await m.getRepository(LibraryVisionPreset).insert({ ...v, updatedBy: by });
      added.visionPresets++;
    }
    const haveMachines = new Set((await m.getRepository(LibraryMachine).find()).map((n) => n.name.toLowerCase()));
    for (const mc of value.machines) {
      if (haveMachines.has(mc.name.toLowerCase())) continue;
      await m.getRepository(LibraryMachine).insert({ ...mc, updatedBy: by });
      added.machines++;
    }
    const pkgs = await m.getRepository(LibraryPackage).find();
    const byKey = new Map(pkgs.map((p) => [p.nameKey, p]));
    const aliasKeys = new Set((await m.getRepository(LibraryAlias).find()).map((a) => a.patternKey));
    for (const input of value.packages) {
      let p = byKey.get(input.name.toLowerCase());
      if (!p) {
        if (aliasKeys.has(input.name.toLowerCase())) continue; // someone made it an alias: leave it
        const { aliases: _a, ...fields } = input;
        p = m.getRepository(LibraryPackage).create({ ...fields, nameKey: input.name.toLowerCase(), updatedBy: by });
        await m.getRepository(LibraryPackage).save(p);
        byKey.set(p.nameKey, p);
        added.packages++;
      }
      for (const a of input.aliases) {
        const k = a.toLowerCase();
        if (aliasKeys.has(k) || byKey.has(k)) continue;
        await m.getRepository(LibraryAlias).insert({ pattern: a, patternKey: k, packageId: p.id, updatedBy: by });
        aliasKeys.add(k);
        added.aliases++;
      }
    }
    if (Object.values(added).some((n) => n > 0)) {
      await m.getRepository(LibraryRevision).insert({ actorId: null, actorEmail: null, entity: 'library', entityId: null, entityName: 'starter library', action: 'seed', before: null, after: added as never });
      log(`starter library: added ${added.packages} packages, ${added.aliases} aliases, ${added.nozzles} nozzles, ${added.visionPresets} vision presets, ${added.machines} machines`);
    }
  });
}
