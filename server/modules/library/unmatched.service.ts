// The unmatched-footprints queue: footprints seen in imports that no package matches.
import type { DataSource, EntityManager } from 'typeorm';
import type { CreatePackageInput, UnmatchedDto } from '../../../shared/schemas/library.schema';
import { LibraryUnmatchedFootprint } from '../../db/entities/library-unmatched.entity';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../../lib/errors';
import type { AuditActor } from '../audit/audit.service';
import type { LibraryService } from './library.service';

/**
 * Records the footprints of one program's import that matched no package. Call it inside the
 * import's transaction. `count` is the number of placements with that footprint in this import;
 * a later import of the same program replaces that program's count. A footprint seen again after
 * it was resolved (say its package was deleted) opens again.
 */
export async function recordUnmatchedFootprints(manager: EntityManager, programLabel: string, items: { footprint: string; count: number }[]): Promise<void> {
  const merged = new Map<string, { footprint: string; count: number }>();
  for (const it of items) {
    const footprint = it.footprint.trim();
    if (!footprint) continue;
    const key = footprint.toLowerCase().slice(0, 200);
    const m = merged.get(key);
    if (m) m.count += it.count;
    else merged.set(key, { footprint: footprint.slice(0, 200), count: it.count });
  }
  for (const [key, { footprint, count }] of merged) {
    await manager.query(
      `INSERT INTO "library_unmatched_footprints" ("footprint", "footprint_key", "programs") VALUES ($1, $2, jsonb_build_object($3::text, $4::int))
       ON CONFLICT ("footprint_key") DO UPDATE SET "programs" = "library_unmatched_footprints"."programs" || EXCLUDED."programs", "last_seen" = now(),
         "resolved_at" = NULL, "resolved_package" = NULL, "resolved_by" = NULL`,
      [footprint, key, programLabel, Math.max(0, Math.round(count))],
    );
  }
}

function globMatches(pattern: string, s: string): boolean {
  let re = '^';
  for (const ch of pattern) re += ch === '*' ? '.*' : ch === '?' ? '.' : ch.replace(/[.+^${}()|[\]\\]/g, '\\$&');
  return new RegExp(re + '$', 'i').test(s);
}

export function toUnmatchedDto(u: LibraryUnmatchedFootprint): UnmatchedDto {
  const programs = Object.entries(u.programs ?? {})
    .map(([label, count]) => ({ label, count: Number(count) }))
    .sort((a, b) => (a.label < b.label ? -1 : 1));
  return {
    id: u.id,
    footprint: u.footprint,
    count: programs.reduce((s, p) => s + p.count, 0),
    programs,
    firstSeen: u.firstSeen.toISOString(),
    lastSeen: u.lastSeen.toISOString(),
    status: u.resolvedAt ? 'resolved' : 'open',
    resolvedAt: u.resolvedAt ? u.resolvedAt.toISOString() : null,
    resolvedPackageName: u.resolvedPackage,
    resolvedBy: u.resolvedBy,
  };
}

export class UnmatchedService {
  constructor(
    private readonly ds: DataSource,
    private readonly library: LibraryService,
  ) {}

  async list(): Promise<UnmatchedDto[]> {
    const rows = await this.ds.getRepository(LibraryUnmatchedFootprint).find();
    return rows.map(toUnmatchedDto).sort((a, b) => (a.status === b.status ? b.count - a.count || (a.footprint < b.footprint ? -1 : 1) : a.status === 'open' ? -1 : 1));
  }

  private async openEntry(m: EntityManager, id: string): Promise<LibraryUnmatchedFootprint> {
    const u = await m.getRepository(LibraryUnmatchedFootprint).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!u) throw new NotFoundError('The unmatched footprint');
    if (u.resolvedAt) throw new ConflictError(`${u.footprint} was already resolved (to ${u.resolvedPackage ?? 'a package'} by ${u.resolvedBy ?? 'someone'}). Reload the queue.`);
    return u;
  }

  private async resolve(m: EntityManager, u: LibraryUnmatchedFootprint, pkgName: string, by: string | null) {
    await m.query('UPDATE "library_unmatched_footprints" SET "resolved_at" = now(), "resolved_package" = $2, "resolved_by" = $3 WHERE "id" = $1', [u.id, pkgName, by]);
  }

  /** Creates a package from an unmatched footprint; the footprint becomes an alias unless the package already matches it. */
  async createPackage(id: string, input: CreatePackageInput, actor: AuditActor, ip: string | null) {
    return this.ds.transaction(async (m) => {
      const u = await this.openEntry(m, id);
      const matches = input.name.toLowerCase() === u.footprintKey || input.aliases.some((a) => globMatches(a, u.footprint));
      const full = matches ? input : { ...input, aliases: [...input.aliases, u.footprint] };
      const p = await this.library.createPackageIn(m, full, actor, ip);
      await this.resolve(m, u, p.name, actor.email);
      await this.library.resolveOthers(m, actor.email);
      return this.library.getPackage(p.id, m);
    });
  }

  /** Adds the footprint (or a pattern that matches it) as an alias of an existing package. */
  async addAlias(id: string, packageId: string, pattern: string | undefined, actor: AuditActor, ip: string | null) {
    return this.ds.transaction(async (m) => {
      const u = await this.openEntry(m, id);
      const pat = pattern ?? u.footprint;
      if (!globMatches(pat, u.footprint)) throw new BadRequestError(`The pattern ${pat} does not match ${u.footprint}.`, [{ path: 'pattern', message: `Does not match ${u.footprint}` }]);
      const p = await m.getRepository(LibraryPackage).findOneBy({ id: packageId });
      if (!p) throw new NotFoundError('The package');
      const alias = await this.library.createAliasIn(m, { pattern: pat, packageId }, actor, ip);
      await this.resolve(m, u, p.name, actor.email);
      await this.library.resolveOthers(m, actor.email);
      return alias;
    });
  }
}
