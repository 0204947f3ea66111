// The library's history: a revision row (before and after) and an audit event for every edit.
import type { DataSource, EntityManager } from 'typeorm';
import type { LibraryEntityKind, RevisionDto } from '../../../shared/schemas/library.schema';
import { LibraryRevision } from '../../db/entities/library-revision.entity';
import type { AuditActor, AuditService } from '../audit/audit.service';
import { toRevisionDto } from './library-dto';

export class RevisionLog {
  constructor(
    private readonly ds: DataSource,
    private readonly audit: AuditService,
  ) {}

  /** Writes one revision and its audit event (`library.<entity>.<action>`) inside `m`. */
  async record(m: EntityManager, actor: AuditActor | null, entity: LibraryEntityKind, entityId: string | null, entityName: string, action: string, before: Record<string, unknown> | null, after: Record<string, unknown> | null, ip: string | null) {
    await m.getRepository(LibraryRevision).insert({ actorId: actor?.id ?? null, actorEmail: actor?.email ?? null, entity, entityId, entityName, action, before: before as never, after: after as never });
    await this.audit.record(actor, `library.${entity}.${action}`, entityName.slice(0, 200), entityId ? { id: entityId } : {}, ip, m);
  }

  /** The newest revisions first, optionally of one kind or one thing. */
  async list(q: { entity?: LibraryEntityKind; entityId?: string; limit: number }): Promise<RevisionDto[]> {
    const where: Record<string, unknown> = {};
    if (q.entity) where.entity = q.entity;
    if (q.entityId) where.entityId = q.entityId;
    const rows = await this.ds.getRepository(LibraryRevision).find({ where, order: { id: 'DESC' }, take: q.limit });
    return rows.map(toRevisionDto);
  }
}
