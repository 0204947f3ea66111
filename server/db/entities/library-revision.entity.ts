import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One edit of the library: who, when, what, and the thing before and after. */
@Entity({ name: 'library_revisions' })
@Index('idx_library_revisions_entity', ['entity', 'entityId'])
export class LibraryRevision {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id!: string;

  @Index('idx_library_revisions_at')
  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date;

  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId!: string | null;

  @Column({ name: 'actor_email', type: 'varchar', length: 254, nullable: true })
  actorEmail!: string | null;

  /** package, alias, nozzle, vision-preset, machine or library (a whole-library import). */
  @Column({ type: 'varchar', length: 20 })
  entity!: string;

  @Column({ name: 'entity_id', type: 'uuid', nullable: true })
  entityId!: string | null;

  @Column({ name: 'entity_name', type: 'varchar', length: 200 })
  entityName!: string;

  /** create, update, delete, import */
  @Column({ type: 'varchar', length: 20 })
  action!: string;

  @Column({ type: 'jsonb', nullable: true })
  before!: Record<string, unknown> | null;

  @Column({ type: 'jsonb', nullable: true })
  after!: Record<string, unknown> | null;
}
