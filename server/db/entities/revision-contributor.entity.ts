import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * Everyone who changed a revision (created it, imported its file, edited its settings or
 * overrides, gave or took back a waiver, submitted it), one row per person, with what they did.
 * The four-eyes rule reads it: whoever releases a revision must not be in its list.
 */
@Entity({ name: 'revision_contributors' })
export class RevisionContributor {
  @PrimaryColumn({ name: 'revision_id', type: 'uuid' })
  revisionId!: string;

  @PrimaryColumn({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @Column({ name: 'user_email', type: 'varchar', length: 254 })
  userEmail!: string;

  /** What they did, each once: 'create', 'import', 'settings', 'overrides', 'waiver', 'submit', … */
  @Column({ type: 'text', array: true, default: () => "'{}'" })
  actions!: string[];

  @Column({ name: 'first_at', type: 'timestamptz', default: () => 'now()' })
  firstAt!: Date;

  @Column({ name: 'last_at', type: 'timestamptz', default: () => 'now()' })
  lastAt!: Date;
}
