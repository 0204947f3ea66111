// The package library: packages, aliases, nozzles, vision presets and machine profiles,
// with a revision row and an audit event for every edit and optimistic locking by version.
import type { DataSource, EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import { In, IsNull } from 'typeorm';
import { PackageMatcher } from '../../../shared/library';
import { libraryFileSchema, type LibraryFile } from '../../../shared/schemas/library-file.schema';
import {
  isPattern,
  packageWarnings,
  type AliasDto,
  type AliasInput,
  type CreatePackageInput,
  type ImportResult,
  type LibraryEntityKind,
  type MachineDto,
  type MachineInput,
  type MatchResult,
  type NozzleDto,
  type NozzleInput,
  type PackageDto,
  type PackageInput,
  type RevisionDto,
  type VisionPresetDto,
  type VisionPresetInput,
} from '../../../shared/schemas/library.schema';
import { LibraryAlias } from '../../db/entities/library-alias.entity';
import { LibraryMachine } from '../../db/entities/library-machine.entity';
import { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { LibraryRevision } from '../../db/entities/library-revision.entity';
import { LibraryUnmatchedFootprint } from '../../db/entities/library-unmatched.entity';
import { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import { ConflictError, NotFoundError, ValidationError, type FieldError } from '../../lib/errors';
import type { AuditActor, AuditService } from '../audit/audit.service';
import { checkCsv } from './csv-import';
import { parseLibraryFile, toLibraryFileObject, toLibraryFileText, type LibraryRows } from './library-file';


const iso = (d: Date) => d.toISOString();

// ---------------------------------------------------------------- snapshots and DTOs

export function packageSnapshot(p: LibraryPackage, aliases: string[] = []): Record<string, unknown> {
  return {
    name: p.name, family: p.family, bodyLength: p.bodyLength, bodyWidth: p.bodyWidth, bodyHeight: p.bodyHeight,
    offsetX: p.offsetX, offsetY: p.offsetY, courtyard: p.courtyard, rotationOffset: p.rotationOffset,
    polarised: p.polarised, overhang: p.overhang, nozzles: [...p.nozzles], vision: p.vision,
    tapeWidth: p.tapeWidth, tapePitch: p.tapePitch, feeder: p.feeder, padLength: p.padLength,
    padWidth: p.padWidth, padCount: p.padCount, notes: p.notes, aliases, version: p.version,
  };
}

function toPackageDto(p: LibraryPackage, aliases: LibraryAlias[], nozzles: LibraryNozzle[]): PackageDto {
  const snap = packageSnapshot(p) as Omit<PackageDto, 'id' | 'aliases' | 'warnings' | 'updatedAt' | 'updatedBy'>;
  return {
    ...snap,
    id: p.id,
    version: p.version,
    updatedAt: iso(p.updatedAt),
    updatedBy: p.updatedBy,
    aliases: aliases.map((a) => ({ id: a.id, pattern: a.pattern, version: a.version })),
    warnings: packageWarnings(p, nozzles),
  };
}

const toNozzleDto = (n: LibraryNozzle): NozzleDto => ({
  id: n.id, name: n.name, tipOuter: n.tipOuter, tipInner: n.tipInner, holderRadius: n.holderRadius, notes: n.notes,
  version: n.version, updatedAt: iso(n.updatedAt), updatedBy: n.updatedBy,
});
const toPresetDto = (v: LibraryVisionPreset): VisionPresetDto => ({
  id: v.id, name: v.name, method: v.method, lighting: v.lighting, sizeTolerancePct: v.sizeTolerancePct,
  maxCentringOffset: v.maxCentringOffset, maxAngleCorrection: v.maxAngleCorrection, notes: v.notes,
  version: v.version, updatedAt: iso(v.updatedAt), updatedBy: v.updatedBy,
});
const toMachineDto = (m: LibraryMachine): MachineDto => ({
  id: m.id, name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: [...m.nozzles], maxPartHeight: m.maxPartHeight,
  notes: m.notes, version: m.version, updatedAt: iso(m.updatedAt), updatedBy: m.updatedBy,
});
const toAliasDto = (a: LibraryAlias, pkgName: string): AliasDto => ({
  id: a.id, pattern: a.pattern, isPattern: isPattern(a.pattern), packageId: a.packageId, packageName: pkgName,
  version: a.version, updatedAt: iso(a.updatedAt), updatedBy: a.updatedBy,
});
function toRevisionDto(r: LibraryRevision): RevisionDto {
  return {
    id: String(r.id), at: iso(r.at), actorEmail: r.actorEmail, entity: r.entity as LibraryEntityKind, entityId: r.entityId,
    entityName: r.entityName, action: r.action, before: r.before, after: r.after,
  };
}

export function conflict(what: string, seen: number, now: number): ConflictError {
  return new ConflictError(
    `${what} was changed by someone else since you opened it (your version ${seen}, now ${now}). Nothing was saved and nothing of theirs was lost: reload to see their change, then make yours again — your edits stay in the form.`,
  );
}

// ---------------------------------------------------------------- reading the whole library

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

// ---------------------------------------------------------------- the service

type Named = ObjectLiteral & { id: string; name: string; version: number; updatedBy: string | null };

interface NamedKind<E extends Named, I, D> {
  entity: Exclude<LibraryEntityKind, 'package' | 'alias' | 'library'>;
  cls: EntityTarget<E>;
  what: string;
  toDto(e: E): D;
  snapshot(e: E): Record<string, unknown>;
  assign(e: E, input: I): void;
}

const NOZZLE: NamedKind<LibraryNozzle, NozzleInput, NozzleDto> = {
  entity: 'nozzle', cls: LibraryNozzle, what: 'Nozzle', toDto: toNozzleDto,
  snapshot: (n) => ({ name: n.name, tipOuter: n.tipOuter, tipInner: n.tipInner, holderRadius: n.holderRadius, notes: n.notes, version: n.version }),
  assign: (n, i) => Object.assign(n, { name: i.name, tipOuter: i.tipOuter, tipInner: i.tipInner, holderRadius: i.holderRadius, notes: i.notes }),
};
const PRESET: NamedKind<LibraryVisionPreset, VisionPresetInput, VisionPresetDto> = {
  entity: 'vision-preset', cls: LibraryVisionPreset, what: 'Vision preset', toDto: toPresetDto,
  snapshot: (v) => ({ name: v.name, method: v.method, lighting: v.lighting, sizeTolerancePct: v.sizeTolerancePct, maxCentringOffset: v.maxCentringOffset, maxAngleCorrection: v.maxAngleCorrection, notes: v.notes, version: v.version }),
  assign: (v, i) => Object.assign(v, i),
};
const MACHINE: NamedKind<LibraryMachine, MachineInput, MachineDto> = {
  entity: 'machine', cls: LibraryMachine, what: 'Machine profile', toDto: toMachineDto,
  snapshot: (m) => ({ name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: [...m.nozzles], maxPartHeight: m.maxPartHeight, notes: m.notes, version: m.version }),
  assign: (m, i) => Object.assign(m, i),
};

export class LibraryService {
  constructor(
    private readonly ds: DataSource,
    private readonly audit: AuditService,
  ) {}

  /** The engine's LibraryFile; the programs module calls this to run jobs. */
  getLibraryFile(manager?: EntityManager): Promise<LibraryFile> {
    return getLibraryFile(manager ?? this.ds.manager);
  }

  resolveOthers(m: EntityManager, by: string | null): Promise<number> {
    return resolveNowMatched(m, by);
  }

  async exportText(): Promise<string> {
    return toLibraryFileText(await loadLibraryRows(this.ds.manager));
  }

  async revision(m: EntityManager, actor: AuditActor | null, entity: LibraryEntityKind, entityId: string | null, entityName: string, action: string, before: Record<string, unknown> | null, after: Record<string, unknown> | null, ip: string | null) {
    await m.getRepository(LibraryRevision).insert({ actorId: actor?.id ?? null, actorEmail: actor?.email ?? null, entity, entityId, entityName, action, before: before as never, after: after as never });
    await this.audit.record(actor, `library.${entity}.${action}`, entityName.slice(0, 200), entityId ? { id: entityId } : {}, ip, m);
  }

  async revisions(q: { entity?: LibraryEntityKind; entityId?: string; limit: number }): Promise<RevisionDto[]> {
    const where: Record<string, unknown> = {};
    if (q.entity) where.entity = q.entity;
    if (q.entityId) where.entityId = q.entityId;
    const rows = await this.ds.getRepository(LibraryRevision).find({ where, order: { id: 'DESC' }, take: q.limit });
    return rows.map(toRevisionDto);
  }

  // ------------------------------------------------------------ packages

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

  /** Alias checks: not a package name, not another package's alias, not twice. */
  private async aliasErrors(m: EntityManager, patterns: string[], packageId: string | null, packageName: string | null, prefix: string): Promise<FieldError[]> {
    const errors: FieldError[] = [];
    const keys = patterns.map((p) => p.toLowerCase());
    if (keys.length === 0) return errors;
    const pkgs = await m.getRepository(LibraryPackage).findBy({ nameKey: In(keys) });
    const existing = await m.getRepository(LibraryAlias).find({ where: { patternKey: In(keys) }, relations: { package: true } });
    const seen = new Set<string>();
    keys.forEach((k, i) => {
      const path = `${prefix}${i}`;
      if (seen.has(k)) errors.push({ path, message: `"${patterns[i]}" is listed twice` });
      seen.add(k);
      if (packageName && k === packageName.toLowerCase()) errors.push({ path, message: 'The package name already matches itself; an alias equal to it is not needed' });
      const pkg = pkgs.find((p) => p.nameKey === k && p.id !== packageId);
      if (pkg) errors.push({ path, message: `"${patterns[i]}" is the name of package ${pkg.name}; a footprint with that name always goes to it` });
      const a = existing.find((x) => x.patternKey === k);
      if (a) errors.push({ path, message: a.packageId === packageId ? `"${patterns[i]}" is already an alias of this package` : `"${patterns[i]}" already points to package ${a.package?.name ?? a.packageId}` });
    });
    return errors;
  }

  private assignPackage(p: LibraryPackage, i: PackageInput, by: string | null) {
    Object.assign(p, {
      name: i.name, nameKey: i.name.toLowerCase(), family: i.family, bodyLength: i.bodyLength, bodyWidth: i.bodyWidth, bodyHeight: i.bodyHeight,
      offsetX: i.offsetX, offsetY: i.offsetY, courtyard: i.courtyard, rotationOffset: i.rotationOffset, polarised: i.polarised, overhang: i.overhang,
      nozzles: [...i.nozzles], vision: i.vision, tapeWidth: i.tapeWidth, tapePitch: i.tapePitch, feeder: i.feeder, padLength: i.padLength,
      padWidth: i.padWidth, padCount: i.padCount, notes: i.notes, updatedBy: by,
    });
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
    const errors = [...(await this.referenceErrors(m, input)), ...(await this.aliasErrors(m, input.aliases, null, input.name, 'aliases.'))];
    if (errors.length) throw new ValidationError(errors.length === 1 ? `${errors[0].path}: ${errors[0].message}` : `${errors.length} fields need attention.`, errors);
    const repo = m.getRepository(LibraryPackage);
    const p = repo.create();
    this.assignPackage(p, input, actor?.email ?? null);
    await repo.save(p);
    for (const pattern of input.aliases) await this.insertAlias(m, pattern, p, actor, ip);
    await this.revision(m, actor, 'package', p.id, p.name, 'create', null, packageSnapshot(p, [...input.aliases]), ip);
    return p;
  }

  private async insertAlias(m: EntityManager, pattern: string, p: LibraryPackage, actor: AuditActor | null, ip: string | null): Promise<LibraryAlias> {
    const repo = m.getRepository(LibraryAlias);
    const a = repo.create({ pattern, patternKey: pattern.toLowerCase(), packageId: p.id, updatedBy: actor?.email ?? null });
    await repo.save(a);
    await this.revision(m, actor, 'alias', a.id, pattern, 'create', null, { pattern, package: p.name, version: a.version }, ip);
    return a;
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
    this.assignPackage(p, input, actor?.email ?? null);
    await repo.save(p);
    await this.revision(m, actor, 'package', p.id, p.name, 'update', before, packageSnapshot(p, aliases), ip);
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
      await this.revision(m, actor, 'package', id, p.name, 'delete', packageSnapshot(p, aliases), null, ip);
    });
  }

  // ------------------------------------------------------------ aliases

  async listAliases(): Promise<AliasDto[]> {
    const rows = await this.ds.getRepository(LibraryAlias).find({ relations: { package: true }, order: { patternKey: 'ASC' } });
    return rows.map((a) => toAliasDto(a, a.package?.name ?? ''));
  }

  async createAliasIn(m: EntityManager, input: AliasInput, actor: AuditActor | null, ip: string | null): Promise<AliasDto> {
    const p = await m.getRepository(LibraryPackage).findOneBy({ id: input.packageId });
    if (!p) throw new NotFoundError('The package');
    const errors = (await this.aliasErrors(m, [input.pattern], p.id, p.name, '')).map((e) => ({ ...e, path: 'pattern' }));
    if (errors.length) throw new ConflictError(errors[0].message, errors);
    const a = await this.insertAlias(m, input.pattern, p, actor, ip);
    return toAliasDto(a, p.name);
  }

  async createAlias(input: AliasInput, actor: AuditActor, ip: string | null): Promise<AliasDto> {
    return this.ds.transaction(async (m) => {
      const a = await this.createAliasIn(m, input, actor, ip);
      await resolveNowMatched(m, actor.email);
      return a;
    });
  }

  async updateAlias(id: string, input: AliasInput & { version: number }, actor: AuditActor, ip: string | null): Promise<AliasDto> {
    return this.ds.transaction(async (m) => {
      const repo = m.getRepository(LibraryAlias);
      const a = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!a) throw new NotFoundError('The alias');
      const oldPkg = await m.getRepository(LibraryPackage).findOneByOrFail({ id: a.packageId });
      if (a.version !== input.version) throw conflict(`Alias ${a.pattern}`, input.version, a.version);
      const p = await m.getRepository(LibraryPackage).findOneBy({ id: input.packageId });
      if (!p) throw new NotFoundError('The package');
      const errors = input.pattern.toLowerCase() === a.patternKey ? [] : (await this.aliasErrors(m, [input.pattern], p.id, p.name, '')).map((e) => ({ ...e, path: 'pattern' }));
      if (errors.length) throw new ConflictError(errors[0].message, errors);
      const before = { pattern: a.pattern, package: oldPkg.name, version: a.version };
      Object.assign(a, { pattern: input.pattern, patternKey: input.pattern.toLowerCase(), packageId: p.id, updatedBy: actor.email });
      a.package = undefined;
      await repo.save(a);
      await this.revision(m, actor, 'alias', a.id, a.pattern, 'update', before, { pattern: a.pattern, package: p.name, version: a.version }, ip);
      await resolveNowMatched(m, actor.email);
      return toAliasDto(a, p.name);
    });
  }

  async deleteAlias(id: string, version: number, actor: AuditActor, ip: string | null): Promise<void> {
    await this.ds.transaction(async (m) => {
      const repo = m.getRepository(LibraryAlias);
      const a = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!a) throw new NotFoundError('The alias');
      if (a.version !== version) throw conflict(`Alias ${a.pattern}`, version, a.version);
      const p = await m.getRepository(LibraryPackage).findOneBy({ id: a.packageId });
      await repo.delete({ id });
      await this.revision(m, actor, 'alias', id, a.pattern, 'delete', { pattern: a.pattern, package: p?.name ?? null, version: a.version }, null, ip);
    });
  }

  // ------------------------------------------------------------ nozzles, vision presets, machines

  listNozzles = () => this.listNamed(NOZZLE);
  createNozzle = (i: NozzleInput, a: AuditActor, ip: string | null) => this.createNamed(NOZZLE, i, a, ip);
  updateNozzle = (id: string, i: NozzleInput & { version: number }, a: AuditActor, ip: string | null) => this.updateNamed(NOZZLE, id, i, a, ip);
  deleteNozzle = (id: string, v: number, a: AuditActor, ip: string | null) => this.deleteNamed(NOZZLE, id, v, a, ip);
  listPresets = () => this.listNamed(PRESET);
  createPreset = (i: VisionPresetInput, a: AuditActor, ip: string | null) => this.createNamed(PRESET, i, a, ip);
  updatePreset = (id: string, i: VisionPresetInput & { version: number }, a: AuditActor, ip: string | null) => this.updateNamed(PRESET, id, i, a, ip);
  deletePreset = (id: string, v: number, a: AuditActor, ip: string | null) => this.deleteNamed(PRESET, id, v, a, ip);
  listMachines = () => this.listNamed(MACHINE);
  createMachine = (i: MachineInput, a: AuditActor, ip: string | null) => this.createNamed(MACHINE, i, a, ip);
  updateMachine = (id: string, i: MachineInput & { version: number }, a: AuditActor, ip: string | null) => this.updateNamed(MACHINE, id, i, a, ip);
  deleteMachine = (id: string, v: number, a: AuditActor, ip: string | null) => this.deleteNamed(MACHINE, id, v, a, ip);

  private async listNamed<E extends Named, I, D>(k: NamedKind<E, I, D>): Promise<D[]> {
    const rows = await this.ds.getRepository(k.cls).find();
    return rows.sort((a, b) => (a.name.toLowerCase() < b.name.toLowerCase() ? -1 : 1)).map(k.toDto);
  }

  private async checkNamed<E extends Named, I extends { name: string }, D>(m: EntityManager, k: NamedKind<E, I, D>, input: I, selfId: string | null) {
    const rows = await m.getRepository(k.cls).find();
    const same = rows.find((r) => r.name.toLowerCase() === input.name.toLowerCase() && r.id !== selfId);
    if (same) throw new ConflictError(`${k.what} ${same.name} already exists.`, [{ path: 'name', message: `${same.name} already exists` }]);
    if (k.entity === 'machine') {
      const known = new Set((await m.getRepository(LibraryNozzle).find()).map((n) => n.name));
      const errors = ((input as unknown as MachineInput).nozzles ?? []).flatMap((n, i) => (known.has(n) ? [] : [{ path: `nozzles.${i}`, message: `Nozzle ${n} is not in the library` }]));
      if (errors.length) throw new ValidationError(`${errors[0].path}: ${errors[0].message}`, errors);
    }
  }

  private async createNamed<E extends Named, I extends { name: string }, D>(k: NamedKind<E, I, D>, input: I, actor: AuditActor, ip: string | null): Promise<D> {
    return this.ds.transaction(async (m) => {
      await this.checkNamed(m, k, input, null);
      const repo = m.getRepository(k.cls);
      const e = repo.create();
      k.assign(e, input);
      e.updatedBy = actor.email;
      await repo.save(e);
      await this.revision(m, actor, k.entity, e.id, e.name, 'create', null, k.snapshot(e), ip);
      return k.toDto(e);
    });
  }

  private async updateNamed<E extends Named, I extends { name: string }, D>(k: NamedKind<E, I, D>, id: string, input: I & { version: number }, actor: AuditActor, ip: string | null): Promise<D> {
    return this.ds.transaction(async (m) => {
      const repo = m.getRepository(k.cls);
      const e = await repo.findOne({ where: { id } as never, lock: { mode: 'pessimistic_write' } });
      if (!e) throw new NotFoundError(`The ${k.what.toLowerCase()}`);
      if (e.version !== input.version) throw conflict(`${k.what} ${e.name}`, input.version, e.version);
      await this.checkNamed(m, k, input, id);
      const before = k.snapshot(e);
      const { version: _v, ...fields } = input;
      k.assign(e, fields as unknown as I);
      e.updatedBy = actor.email;
      await repo.save(e);
      if (before.name !== e.name) await this.renameReferences(m, k.entity, String(before.name), e.name);
      await this.revision(m, actor, k.entity, e.id, e.name, 'update', before, k.snapshot(e), ip);
      return k.toDto(e);
    });
  }

  /** A renamed nozzle or preset keeps its packages and machines (their versions move on). */
  private async renameReferences(m: EntityManager, entity: string, from: string, to: string) {
    if (entity === 'nozzle') {
      await m.query(`UPDATE "library_packages" SET "nozzles" = array_replace("nozzles", $1, $2), "version" = "version" + 1 WHERE $1 = ANY("nozzles")`, [from, to]);
      await m.query(`UPDATE "library_machines" SET "nozzles" = array_replace("nozzles", $1, $2), "version" = "version" + 1 WHERE $1 = ANY("nozzles")`, [from, to]);
    } else if (entity === 'vision-preset') {
      await m.query(`UPDATE "library_packages" SET "vision" = $2, "version" = "version" + 1 WHERE "vision" = $1`, [from, to]);
    }
  }

  private async deleteNamed<E extends Named, I, D>(k: NamedKind<E, I, D>, id: string, version: number, actor: AuditActor, ip: string | null): Promise<void> {
    await this.ds.transaction(async (m) => {
      const repo = m.getRepository(k.cls);
      const e = await repo.findOne({ where: { id } as never, lock: { mode: 'pessimistic_write' } });
      if (!e) throw new NotFoundError(`The ${k.what.toLowerCase()}`);
      if (e.version !== version) throw conflict(`${k.what} ${e.name}`, version, e.version);
      let users: { name: string }[] = [];
      if (k.entity === 'nozzle') {
        users = [
          ...(await m.query(`SELECT "name" FROM "library_packages" WHERE $1 = ANY("nozzles") ORDER BY "name_key"`, [e.name])),
          ...(await m.query(`SELECT "name" FROM "library_machines" WHERE $1 = ANY("nozzles") ORDER BY "name"`, [e.name])),
        ];
      } else if (k.entity === 'vision-preset') {
        users = await m.query(`SELECT "name" FROM "library_packages" WHERE "vision" = $1 ORDER BY "name_key"`, [e.name]);
      }
      if (users.length) {
        const names = users.slice(0, 5).map((u) => u.name).join(', ') + (users.length > 5 ? ` and ${users.length - 5} more` : '');
        throw new ConflictError(`${k.what} ${e.name} is still used by ${names}; take it off them first.`);
      }
      await repo.delete({ id } as never);
      await this.revision(m, actor, k.entity, id, e.name, 'delete', k.snapshot(e), null, ip);
    });
  }

  // ------------------------------------------------------------ matching

  async match(footprint: string): Promise<MatchResult> {
    const file = await this.getLibraryFile();
    const hit = new PackageMatcher(file.packages).match(footprint);
    let packageId: string | null = null;
    if (hit.pkg) packageId = (await this.ds.getRepository(LibraryPackage).findOneBy({ nameKey: hit.pkg.name.toLowerCase() }))?.id ?? null;
    return { footprint, packageId, packageName: hit.pkg?.name ?? null, matchedBy: hit.by };
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
          const p = await this.updatePackageIn(m, row.existingId, { ...fields, version: cur.version }, actor, ip);
          const have = new Set((await m.getRepository(LibraryAlias).findBy({ packageId: p.id })).map((a) => a.patternKey));
          for (const a of aliases) if (!have.has(a.toLowerCase())) await this.insertAlias(m, a, p, actor, ip);
          updated++;
        } else {
          await this.createPackageIn(m, row.input, actor, ip);
          created++;
        }
      }
      await this.audit.record(actor, 'library.csv-import', `${created} created, ${updated} updated`, { created, updated }, ip, m);
      await resolveNowMatched(m, actor.email);
      return { created, updated };
    });
  }

  // ------------------------------------------------------------ import

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
        this.assignPackage(p, input, by);
        await pkgRepo.save(p);
        if (old) await m.getRepository(LibraryAlias).delete({ packageId: p.id });
        if (input.aliases.length) {
          await m.getRepository(LibraryAlias).insert(input.aliases.map((a) => ({ pattern: a, patternKey: a.toLowerCase(), packageId: p.id, updatedBy: by })));
          aliasCount += input.aliases.length;
        }
      }
      const result: ImportResult = { mode, packages: value.packages.length, aliases: aliasCount, nozzles: value.nozzles.length, visionPresets: value.presets.length, machines: value.machines.length };
      await this.revision(m, actor, 'library', null, 'library', 'import', before, { ...result }, ip);
      await resolveNowMatched(m, by);
      return result;
    });
  }
}

function groupAliases(aliases: LibraryAlias[]): Map<string, LibraryAlias[]> {
  const map = new Map<string, LibraryAlias[]>();
  for (const a of [...aliases].sort((x, y) => (x.patternKey < y.patternKey ? -1 : 1))) {
    const list = map.get(a.packageId) ?? [];
    list.push(a);
    map.set(a.packageId, list);
  }
  return map;
}

