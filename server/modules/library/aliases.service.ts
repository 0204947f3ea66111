// Aliases: other footprint names (or patterns) that go to a package. An alias is never a package
// name, never another package's alias, never listed twice.
import type { DataSource, EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { AliasDto, AliasInput } from '../../../shared/schemas/library.schema';
import { LibraryAlias } from '../../db/entities/library-alias.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { ConflictError, NotFoundError, type FieldError } from '../../lib/errors';
import type { AuditActor } from '../audit/audit.service';
import { conflict, toAliasDto } from './library-dto';
import { resolveNowMatched } from './library-rows';
import type { RevisionLog } from './revision-log';

export class AliasService {
  constructor(
    private readonly ds: DataSource,
    private readonly log: RevisionLog,
  ) {}

  /** Alias checks: not a package name, not another package's alias, not twice. */
  async aliasErrors(m: EntityManager, patterns: string[], packageId: string | null, packageName: string | null, prefix: string): Promise<FieldError[]> {
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

  /** Inserts an alias of `p` (already checked) and writes its revision. */
  async insertAlias(m: EntityManager, pattern: string, p: LibraryPackage, actor: AuditActor | null, ip: string | null): Promise<LibraryAlias> {
    const repo = m.getRepository(LibraryAlias);
    const a = repo.create({ pattern, patternKey: pattern.toLowerCase(), packageId: p.id, updatedBy: actor?.email ?? null });
    await repo.save(a);
    await this.log.record(m, actor, 'alias', a.id, pattern, 'create', null, { pattern, package: p.name, version: a.version }, ip);
    return a;
  }

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
      await this.log.record(m, actor, 'alias', a.id, a.pattern, 'update', before, { pattern: a.pattern, package: p.name, version: a.version }, ip);
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
      await this.log.record(m, actor, 'alias', id, a.pattern, 'delete', { pattern: a.pattern, package: p?.name ?? null, version: a.version }, null, ip);
    });
  }
}
