// Moving many things at once: the CSV bulk import of packages, and the whole library from and to
// a library file ("placewright-library/1", shared/schemas/README.md "Library file"). Every import
// is one transaction: all of it or nothing, with every problem named by its place in the file.
import type { DataSource, EntityTarget } from 'typeorm';
import type { ImportResult } from '../../../shared/schemas/library.schema';
import { LibraryAlias } from '../../db/entities/library-alias.entity';
import { LibraryMachine } from '../../db/entities/library-machine.entity';
import { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import { ValidationError } from '../../lib/errors';
import type { AuditActor, AuditService } from '../audit/audit.service';
import type { AliasService } from './aliases.service';
import { checkCsv } from './csv-import';
import type { Named } from './equipment.service';
import { parseLibraryFile, toLibraryFileText } from './library-file';
import { loadLibraryRows, resolveNowMatched } from './library-rows';
import { assignPackage, type PackageService } from './packages.service';
import type { RevisionLog } from './revision-log';

export class LibraryTransferService {
  constructor(
    private readonly ds: DataSource,
    private readonly audit: AuditService,
    private readonly log: RevisionLog,
    private readonly packages: PackageService,
    private readonly aliases: AliasService,
  ) {}

  /** The whole library as library-file text (canonical: export → import → export gives the same bytes). */
  async exportText(): Promise<string> {
    return toLibraryFileText(await loadLibraryRows(this.ds.manager));
  }

  // ------------------------------------------------------------ CSV bulk import

  async csvPreview(text: string) {
    const { valid: _valid, ...preview } = await checkCsv(this.ds.manager, text);
    return preview;
  }

  /** All rows or none: any error answers 400 with every row's errors and writes nothing. */
  async csvCommit(text: string, actor: AuditActor, ip: string | null): Promise<{ created: number; updated: number }> {
    return this.ds.transaction(async (m) => {
      const checked = await checkCsv(m, text);
      if (checked.errorCount > 0) {
        const errors = checked.rows.flatMap((r) => r.errors.map((e) => ({ path: `line ${r.line}.${e.path}`, message: e.message })));
        throw new ValidationError(`${checked.errorCount} problem${checked.errorCount === 1 ? '' : 's'} in the file (first: line ${checked.rows.find((r) => r.errors.length)!.line}); nothing was imported.`, errors.slice(0, 500));
      }
      if (checked.valid.length === 0) throw new ValidationError('The file has no package rows.', [{ path: 'csv', message: 'No rows below the header' }]);
      let created = 0;
      let updated = 0;
      for (const row of checked.valid) {
        if (row.existingId) {
          const { aliases, ...fields } = row.input;
          const cur = await m.getRepository(LibraryPackage).findOneByOrFail({ id: row.existingId });
          const p = await this.packages.updatePackageIn(m, row.existingId, { ...fields, version: cur.version }, actor, ip);
          const have = new Set((await m.getRepository(LibraryAlias).findBy({ packageId: p.id })).map((a) => a.patternKey));
          for (const a of aliases) if (!have.has(a.toLowerCase())) await this.aliases.insertAlias(m, a, p, actor, ip);
          updated++;
        } else {
          await this.packages.createPackageIn(m, row.input, actor, ip);
          created++;
        }
      }
      await this.audit.record(actor, 'library.csv-import', `${created} created, ${updated} updated`, { created, updated }, ip, m);
      await resolveNowMatched(m, actor.email);
      return { created, updated };
    });
  }

  // ------------------------------------------------------------ library file import

  /** Replaces or merges the whole library from a library file, in one transaction. */
  async importLibrary(file: unknown, mode: 'replace' | 'merge', actor: AuditActor, ip: string | null): Promise<ImportResult> {
    const { value, errors } = parseLibraryFile(file);
    return this.ds.transaction(async (m) => {
      const current = await loadLibraryRows(m);
      const keep = mode === 'merge';
      // Names that will exist afterwards.
      const fileNozzles = new Set(value.nozzles.map((n) => n.name));
      const nozzleNames = new Set([...fileNozzles, ...(keep ? current.nozzles.map((n) => n.name) : [])]);
      const presetNames = new Set([...value.presets.map((p) => p.name), ...(keep ? current.presets.map((p) => p.name) : [])]);
      const dup = (list: { name: string }[], key: string) => {
        const seen = new Map<string, number>();
        list.forEach((x, i) => {
          const k = x.name.toLowerCase();
          if (seen.has(k)) errors.push({ path: `${key}.${i}.name`, message: `"${x.name}" is also ${key}.${seen.get(k)}` });
          else seen.set(k, i);
        });
      };
      dup(value.packages, 'packages');
      dup(value.nozzles, 'nozzles');
      dup(value.presets, 'visionPresets');
      dup(value.machines, 'machines');
      const filePkgKeys = new Set(value.packages.map((p) => p.name.toLowerCase()));
      const keptPkgs = keep ? current.packages.filter((p) => !filePkgKeys.has(p.nameKey)) : [];
      const pkgNameKeys = new Set([...filePkgKeys, ...keptPkgs.map((p) => p.nameKey)]);
      const keptPkgIds = new Set(keptPkgs.map((p) => p.id));
      const aliasOwner = new Map<string, string>();
      for (const a of current.aliases) if (keptPkgIds.has(a.packageId)) aliasOwner.set(a.patternKey, current.packages.find((p) => p.id === a.packageId)!.name);
      value.packages.forEach((p, i) => {
        p.nozzles.forEach((n, j) => {
          if (!nozzleNames.has(n)) errors.push({ path: `packages.${i}.nozzles.${j}`, message: `Nozzle ${n} is not in the file${keep ? ' or the library' : ''}` });
        });
        if (p.vision && !presetNames.has(p.vision)) errors.push({ path: `packages.${i}.vision`, message: `Vision preset ${p.vision} is not in the file${keep ? ' or the library' : ''}` });
        p.aliases.forEach((a, j) => {
          const k = a.toLowerCase();
          const path = `packages.${i}.aliases.${j}`;
          if (pkgNameKeys.has(k)) errors.push({ path, message: `"${a}" is a package name` });
          else if (aliasOwner.has(k)) errors.push({ path, message: `"${a}" already belongs to package ${aliasOwner.get(k)}` });
          else aliasOwner.set(k, p.name);
        });
      });
      value.machines.forEach((mc, i) =>
        mc.nozzles.forEach((n, j) => {
          if (!nozzleNames.has(n)) errors.push({ path: `machines.${i}.nozzles.${j}`, message: `Nozzle ${n} is not in the file${keep ? ' or the library' : ''}` });
        }),
      );
      if (!keep) {
        // Replacing: nothing else may still refer to what goes away.
      } else {
        current.machines
          .filter((mc) => !value.machines.some((x) => x.name.toLowerCase() === mc.name.toLowerCase()))
          .forEach((mc) => mc.nozzles.forEach((n) => { if (!nozzleNames.has(n)) errors.push({ path: 'nozzles', message: `Machine ${mc.name} needs nozzle ${n}` }); }));
      }
      if (errors.length) {
        throw new ValidationError(errors.length === 1 ? `${errors[0].path}: ${errors[0].message}` : `The file has ${errors.length} problems; nothing was imported.`, errors.slice(0, 200));
      }
      const by = actor.email;
      const before = { packages: current.packages.length, aliases: current.aliases.length, nozzles: current.nozzles.length, visionPresets: current.presets.length, machines: current.machines.length };
      if (!keep) {
        await m.query('DELETE FROM "library_aliases"');
        await m.query('DELETE FROM "library_packages"');
        await m.query('DELETE FROM "library_nozzles"');
        await m.query('DELETE FROM "library_vision_presets"');
        await m.query('DELETE FROM "library_machines"');
      }
      const upsertNamed = async <E extends Named>(cls: EntityTarget<E>, existing: E[], items: { name: string }[]) => {
        const repo = m.getRepository(cls);
        for (const it of items) {
          const old = keep ? existing.find((x) => x.name.toLowerCase() === it.name.toLowerCase()) : undefined;
          const e = old ?? repo.create();
          Object.assign(e, it, { updatedBy: by });
          await repo.save(e);
        }
      };
      await upsertNamed(LibraryNozzle, current.nozzles, value.nozzles);
      await upsertNamed(LibraryVisionPreset, current.presets, value.presets);
      await upsertNamed(LibraryMachine, current.machines, value.machines);
      const pkgRepo = m.getRepository(LibraryPackage);
      let aliasCount = 0;
      for (const input of value.packages) {
        const old = keep ? current.packages.find((p) => p.nameKey === input.name.toLowerCase()) : undefined;
        const p = old ?? pkgRepo.create();
        assignPackage(p, input, by);
        await pkgRepo.save(p);
        if (old) await m.getRepository(LibraryAlias).delete({ packageId: p.id });
        if (input.aliases.length) {
          await m.getRepository(LibraryAlias).insert(input.aliases.map((a) => ({ pattern: a, patternKey: a.toLowerCase(), packageId: p.id, updatedBy: by })));
          aliasCount += input.aliases.length;
        }
      }
      const result: ImportResult = { mode, packages: value.packages.length, aliases: aliasCount, nozzles: value.nozzles.length, visionPresets: value.presets.length, machines: value.machines.length };
      await this.log.record(m, actor, 'library', null, 'library', 'import', before, { ...result }, ip);
      await resolveNowMatched(m, by);
      return result;
    });
  }
}
