import type { DataSource, EntityManager } from 'typeorm';
import type { AuditEventDto, AuditPage, AuditQuery } from '../../../shared/schemas/audit.schema';
import { AuditEvent } from '../../db/entities/audit-event.entity';

export interface AuditActor {
  id: string | null;
  email: string | null;
}

export function toAuditDto(e: AuditEvent): AuditEventDto {
  return {
    id: String(e.id),
    at: e.at.toISOString(),
    actorId: e.actorId,
    actorEmail: e.actorEmail,
    action: e.action,
    target: e.target,
    detail: e.detail,
    ip: e.ip,
  };
}

export class AuditService {
  constructor(private readonly ds: DataSource) {}

  async record(
    actor: AuditActor | null,
    action: string,
    target: string | null = null,
    detail: Record<string, unknown> = {},
    ip: string | null = null,
    manager?: EntityManager,
  ): Promise<void> {
    const repo = (manager ?? this.ds.manager).getRepository(AuditEvent);
    // The columns' widths (target 200, e-mail 254, ip 64): a long value typed at sign-in is shortened, never a 500.
    const cut = (v: string | null, n: number) => (v !== null && v.length > n ? v.slice(0, n - 1) + '…' : v);
    await repo.insert({ actorId: actor?.id ?? null, actorEmail: cut(actor?.email ?? null, 254), action, target: cut(target, 200), detail: detail as never, ip: cut(ip, 64) });
  }

  async list(q: AuditQuery, onlyActorId?: string): Promise<AuditPage> {
    const qb = this.ds.getRepository(AuditEvent).createQueryBuilder('e');
    if (onlyActorId) qb.andWhere('e.actor_id = :aid', { aid: onlyActorId });
    if (q.action) qb.andWhere('e.action = :action', { action: q.action });
    if (q.actor) qb.andWhere('e.actor_email ILIKE :actor', { actor: `%${q.actor.replace(/[%_\\]/g, '\\$&')}%` });
    if (q.from) qb.andWhere('e.at >= :from', { from: q.from });
    if (q.to) qb.andWhere('e.at < :to', { to: q.to });
    qb.orderBy('e.at', 'DESC').addOrderBy('e.id', 'DESC').skip(q.offset).take(q.limit);
    const [rows, total] = await qb.getManyAndCount();
    const actions = await this.ds
      .getRepository(AuditEvent)
      .createQueryBuilder('e')
      .select('DISTINCT e.action', 'action')
      .orderBy('action')
      .getRawMany<{ action: string }>();
    return { items: rows.map(toAuditDto), total, actions: actions.map((a) => a.action) };
  }
}
