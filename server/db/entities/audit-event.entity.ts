import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'audit_events' })
@Index('idx_audit_events_at', ['at'])
export class AuditEvent {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id!: string;

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date;

  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId!: string | null;

  /** Kept as written at the time, so the log still reads after a user is renamed. */
  @Column({ name: 'actor_email', type: 'varchar', length: 254, nullable: true })
  actorEmail!: string | null;

  @Index('idx_audit_events_action')
  @Column({ type: 'varchar', length: 64 })
  action!: string;

  @Column({ type: 'varchar', length: 200, nullable: true })
  target!: string | null;

  @Column({ type: 'jsonb', default: () => "'{}'" })
  detail!: Record<string, unknown>;

  @Column({ type: 'varchar', length: 64, nullable: true })
  ip!: string | null;
}
