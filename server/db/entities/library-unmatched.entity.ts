import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

/** A footprint seen in an import that matched no package: the librarian's queue. */
@Entity({ name: 'library_unmatched_footprints' })
export class LibraryUnmatchedFootprint {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 200 })
  footprint!: string;

  @Index('uq_library_unmatched_key', { unique: true })
  @Column({ name: 'footprint_key', type: 'varchar', length: 200 })
  footprintKey!: string;

  /** Placements per program label, from each program's latest import. */
  @Column({ type: 'jsonb', default: () => "'{}'" })
  programs!: Record<string, number>;

  @CreateDateColumn({ name: 'first_seen', type: 'timestamptz' })
  firstSeen!: Date;

  @UpdateDateColumn({ name: 'last_seen', type: 'timestamptz' })
  lastSeen!: Date;

  @Column({ name: 'resolved_at', type: 'timestamptz', nullable: true })
  resolvedAt!: Date | null;

  @Column({ name: 'resolved_package', type: 'varchar', length: 100, nullable: true })
  resolvedPackage!: string | null;

  @Column({ name: 'resolved_by', type: 'varchar', length: 254, nullable: true })
  resolvedBy!: string | null;
}
