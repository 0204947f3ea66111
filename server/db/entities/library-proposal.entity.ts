import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { ProposalKind } from '../../../shared/schemas/library.schema';

/** An engineer's proposal for the library, decided by a librarian. */
@Entity({ name: 'library_proposals' })
export class LibraryProposal {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 20 })
  kind!: ProposalKind;

  @Index('idx_library_proposals_status')
  @Column({ type: 'varchar', length: 10, default: 'open' })
  status!: 'open' | 'approved' | 'rejected';

  @Column({ name: 'proposer_id', type: 'uuid', nullable: true })
  proposerId!: string | null;

  @Column({ name: 'proposer_email', type: 'varchar', length: 254 })
  proposerEmail!: string;

  /** The unmatched footprint it answers, if any. */
  @Column({ type: 'varchar', length: 200, nullable: true })
  footprint!: string | null;

  /** The package it changes or aliases to (alias, change). */
  @Column({ name: 'package_id', type: 'uuid', nullable: true })
  packageId!: string | null;

  @Column({ type: 'jsonb' })
  payload!: Record<string, unknown>;

  @Column({ type: 'text', default: '' })
  note!: string;

  @Column({ name: 'decided_by_email', type: 'varchar', length: 254, nullable: true })
  decidedByEmail!: string | null;

  @Column({ name: 'decided_at', type: 'timestamptz', nullable: true })
  decidedAt!: Date | null;

  @Column({ name: 'decision_comment', type: 'text', nullable: true })
  decisionComment!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;

  @VersionColumn({ type: 'integer', default: 1 })
  version!: number;
}
