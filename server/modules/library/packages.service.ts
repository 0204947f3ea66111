// Packages: list, read, create, update and delete, each edit checked (name, aliases, nozzles and
// vision preset in the library), versioned and written to the revision log.
import type { DataSource, EntityManager } from 'typeorm';
import type { CreatePackageInput, PackageDto, PackageInput } from '../../../shared/schemas/library.schema';
import { LibraryAlias } from '../../db/entities/library-alias.entity';
import { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import { ConflictError, NotFoundError, ValidationError, type FieldError } from '../../lib/errors';
import type { AuditActor } from '../audit/audit.service';
import type { AliasService } from './aliases.service';
import { conflict, groupAliases, packageSnapshot, toPackageDto } from './library-dto';
import { loadLibraryRows, resolveNowMatched } from './library-rows';
import type { RevisionLog } from './revision-log';

/** Copies a package input onto its row (the name key with it). */
export function assignPackage(p: LibraryPackage, i: PackageInput, by: string | null) {
  Object.assign(p, {
    name: i.name, nameKey: i.name.toLowerCase(), family: i.family, bodyLength: i.bodyLength, bodyWidth: i.bodyWidth, bodyHeight: i.bodyHeight,
    offsetX: i.offsetX, offsetY: i.offsetY, courtyard: i.courtyard, rotationOffset: i.rotationOffset, polarised: i.polarised, overhang: i.overhang,
    nozzles: [...i.nozzles], vision: i.vision, tapeWidth: i.tapeWidth, tapePitch: i.tapePitch, feeder: i.feeder, padLength: i.padLength,
    padWidth: i.padWidth, padCount: i.padCount, notes: i.notes, updatedBy: by,
  });
}

export class PackageService {
  constructor(
    private readonly ds: DataSource,
    private readonly log: RevisionLog,
    private readonly aliases: AliasService,
  ) {}

  async listPackages(): Promise<PackageDto[]> {
    const { packages, aliases, nozzles } = await loadLibraryRows(this.ds.manager);
    const byPkg = groupAliases(aliases);
    return packages.sort((a, b) => (a.nameKey < b.nameKey ? -1 : 1)).map((p) => toPackageDto(p, byPkg.get(p.id) ?? [], nozzles));
  }

  async getPackage(id: string, m: EntityManager = this.ds.manager): Promise<PackageDto> {
    const p = await m.getRepository(LibraryPackage).findOneBy({ id });
    if (!p) throw new NotFoundError('The package');
    const aliases = await m.getRepository(LibraryAlias).find({ where: { packageId: id }, order: { patternKey: 'ASC' } });
    return toPackageDto(p, aliases, await m.getRepository(LibraryNozzle).find());
  }

  /** Unknown nozzles or vision preset: errors naming the field. */
  async referenceErrors(m: EntityManager, input: { nozzles: string[]; vision: string | null }, prefix = ''): Promise<FieldError[]> {
    const errors: FieldError[] = [];
    const nozzles = new Set((await m.getRepository(LibraryNozzle).find()).map((n) => n.name));
    input.nozzles.forEach((n, i) => {
      if (!nozzles.has(n)) errors.push({ path: `${prefix}nozzles.${i}`, message: `Nozzle ${n} is not in the library; add it under Nozzles first` });
    });
    if (input.vision && !(await m.getRepository(LibraryVisionPreset).existsBy({ name: input.vision }))) {
      errors.push({ path: `${prefix}vision`, message: `Vision preset ${input.vision} is not in the library` });
    }
    return errors;
  }

  private async checkPackageName(m: EntityManager, name: string, selfId: string | null) {
    const key = name.toLowerCase();
    const same = await m.getRepository(LibraryPackage).findOneBy({ nameKey: key });
    if (same && same.id !== selfId) throw new ConflictError(`A package named ${same.name} already exists (names are compared without case).`, [{ path: 'name', message: `${same.name} already exists` }]);
    const alias = await m.getRepository(LibraryAlias).findOne({ where: { patternKey: key }, relations: { package: true } });
    if (alias && alias.packageId !== selfId) {
      throw new ConflictError(`"${name}" is already an alias of package ${alias.package?.name}; rename, or remove that alias first.`, [{ path: 'name', message: `Already an alias of ${alias.package?.name}` }]);
    }
  }

  /** Creates a package with its aliases inside `m`; writes revisions and audit events. */
  async createPackageIn(m: EntityManager, input: CreatePackageInput, actor: AuditActor | null, ip: string | null): Promise<LibraryPackage> {
    await this.checkPackageName(m, input.name, null);
    const errors = [...(await this.referenceErrors(m, input)), ...(await this.aliases.aliasErrors(m, input.aliases, null, input.name, 'aliases.'))];
    if (errors.length) throw new ValidationError(errors.length === 1 ? `${errors[0].path}: ${errors[0].message}` : `${errors.length} fields need attention.`, errors);
    const repo = m.getRepository(LibraryPackage);
    const p = repo.create();
    assignPackage(p, input, actor?.email ?? null);
    await repo.save(p);
    for (const pattern of input.aliases) await this.aliases.insertAlias(m, pattern, p, actor, ip);
    await this.log.record(m, actor, 'package', p.id, p.name, 'create', null, packageSnapshot(p, [...input.aliases]), ip);
    return p;
  }

  async createPackage(input: CreatePackageInput, actor: AuditActor, ip: string | null): Promise<PackageDto> {
    return this.ds.transaction(async (m) => {
      const p = await this.createPackageIn(m, input, actor, ip);
      await resolveNowMatched(m, actor.email);
      return this.getPackage(p.id, m);
    });
  }

  async updatePackageIn(m: EntityManager, id: string, input: PackageInput & { version: number }, actor: AuditActor | null, ip: string | null): Promise<LibraryPackage> {
    const repo = m.getRepository(LibraryPackage);
    const p = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!p) throw new NotFoundError('The package');
    if (p.version !== input.version) throw conflict(`Package ${p.name}`, input.version, p.version);
    await this.checkPackageName(m, input.name, p.id);
    const errors = await this.referenceErrors(m, input);
    if (errors.length) throw new ValidationError(errors.length === 1 ? `${errors[0].path}: ${errors[0].message}` : `${errors.length} fields need attention.`, errors);
    const aliases = (await m.getRepository(LibraryAlias).findBy({ packageId: id })).map((a) => a.pattern).sort();
    const before = packageSnapshot(p, aliases);
    assignPackage(p, input, actor?.email ?? null);
    await repo.save(p);
    await this.log.record(m, actor, 'package', p.id, p.name, 'update', before, packageSnapshot(p, aliases), ip);
    return p;
  }

  async updatePackage(id: string, input: PackageInput & { version: number }, actor: AuditActor, ip: string | null): Promise<PackageDto> {
    return this.ds.transaction(async (m) => {
      await this.updatePackageIn(m, id, input, actor, ip);
      await resolveNowMatched(m, actor.email);
      return this.getPackage(id, m);
    });
  }

  async deletePackage(id: string, version: number, actor: AuditActor, ip: string | null): Promise<void> {
    await this.ds.transaction(async (m) => {
      const repo = m.getRepository(LibraryPackage);
      const p = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!p) throw new NotFoundError('The package');
      if (p.version !== version) throw conflict(`Package ${p.name}`, version, p.version);
      const aliases = (await m.getRepository(LibraryAlias).findBy({ packageId: id })).map((a) => a.pattern).sort();
      await repo.delete({ id });
      await this.log.record(m, actor, 'package', id, p.name, 'delete', packageSnapshot(p, aliases), null, ip);
    });
  }
}
