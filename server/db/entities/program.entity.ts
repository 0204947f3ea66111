import { BeforeInsert, BeforeUpdate, Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

/** A placement program: one product's board on one panel, with its revisions A, B, … */
@Entity({ name: 'programs' })
// Names are unique without case: a unique index on lower(name), written in the migration.
@Index('uq_programs_name_ci', { synchronize: false })
export class Program {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  /** Short unique name, e.g. "weather-ctl" (unique without case: the service checks, an index enforces). */
  @Column({ type: 'varchar', length: 80 })
  name!: string;

  @Column({ type: 'varchar', length: 120 })
  product!: string;

  /** The board (and its design revision) the program places, e.g. "WSC-200 rev 3". */
  @Column({ type: 'varchar', length: 120 })
  board!: string;

  @Column({ name: 'owner_id', type: 'uuid' })
  ownerId!: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;

  @VersionColumn({ type: 'integer', default: 1 })
  version!: number;
}

export type RevisionState = 'draft' | 'in-review' | 'released' | 'superseded' | 'withdrawn';

@Entity({ name: 'program_revisions' })
@Index('uq_program_revisions_label', ['programId', 'label'], { unique: true })
export class ProgramRevision {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Index('idx_program_revisions_program')
  @Column({ name: 'program_id', type: 'uuid' })
  programId!: string;

  /** A, B, … */
  @Column({ type: 'varchar', length: 8 })
  label!: string;

  @Column({ type: 'varchar', length: 16, default: 'draft' })
  state!: RevisionState;

  @Column({ name: 'author_id', type: 'uuid' })
  authorId!: string;

  /** Job settings: import options, board outline, panel, fiducials, transform, limits, machine. */
  @Column({ type: 'jsonb', default: () => "'{}'" })
  settings!: Record<string, unknown>;

  @Column({ name: 'centroid_name', type: 'varchar', length: 255, nullable: true })
  centroidName!: string | null;

  /** The uploaded centroid file, byte for byte. */
  @Column({ name: 'centroid_bytes', type: 'bytea', nullable: true })
  centroidBytes!: Buffer | null;

  @Column({ name: 'centroid_sha256', type: 'varchar', length: 64, nullable: true })
  centroidSha256!: string | null;

  /** The engine's import result (placements, mapping, dialect, warnings). */
  @Column({ type: 'jsonb', nullable: true })
  imported!: Record<string, unknown> | null;

  /**
   * Rows of the import that are placed (not do-not-place): what lists show, kept beside the
   * import so that lists never read the import itself. Set from `imported` on every save.
   */
  @Column({ name: 'placement_count', type: 'integer', default: 0 })
  placementCount!: number;

  @BeforeInsert()
  @BeforeUpdate()
  countPlacements() {
    // undefined: the import was not loaded (a partial select), so it is not being changed
    if (this.imported === undefined) return;
    const rows = (this.imported as { placements?: { dnp?: boolean }[] } | null)?.placements ?? [];
    let n = 0;
    for (const p of rows) if (!p.dnp) n++;
    this.placementCount = n;
  }

  /** Per-part overrides keyed by reference: { package?, nozzle?, vision?, reason }. */
  @Column({ type: 'jsonb', default: () => "'{}'" })
  overrides!: Record<string, unknown>;

  /** The last check's findings and summary, or null when inputs changed since. */
  @Column({ type: 'jsonb', nullable: true })
  findings!: unknown[] | null;

  @Column({ name: 'findings_summary', type: 'jsonb', nullable: true })
  findingsSummary!: Record<string, unknown> | null;

  @Column({ name: 'checked_at', type: 'timestamptz', nullable: true })
  checkedAt!: Date | null;

  /** Image underlay for the canvas: { dataUrl, transform, opacity } or null. */
  @Column({ type: 'jsonb', nullable: true })
  underlay!: Record<string, unknown> | null;

  @Column({ name: 'submitted_at', type: 'timestamptz', nullable: true })
  submittedAt!: Date | null;

  @Column({ name: 'reviewer_id', type: 'uuid', nullable: true })
  reviewerId!: string | null;

  @Column({ name: 'reviewed_at', type: 'timestamptz', nullable: true })
  reviewedAt!: Date | null;

  @Column({ name: 'review_comment', type: 'text', nullable: true })
  reviewComment!: string | null;

  @Column({ name: 'released_at', type: 'timestamptz', nullable: true })
  releasedAt!: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;

  @VersionColumn({ type: 'integer', default: 1 })
  version!: number;
}

/** A finding an engineer accepted with a reason; matched to re-run findings by its key. */
@Entity({ name: 'revision_waivers' })
@Index('uq_revision_waivers_key', ['revisionId', 'findingKey'], { unique: true })
export class RevisionWaiver {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'revision_id', type: 'uuid' })
  revisionId!: string;

  /** a finding's key, or for scope 'every-board' its kind and refs with `*` for the board */
  @Column({ name: 'finding_key', type: 'varchar', length: 500 })
  findingKey!: string;

  /** 'finding' (that one finding) or 'every-board' (the same kind and refs on every board) */
  @Column({ type: 'varchar', length: 16, default: 'finding' })
  scope!: string;

  @Column({ type: 'varchar', length: 32 })
  kind!: string;

  @Column({ type: 'text' })
  reason!: string;

  @Column({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @Column({ name: 'user_email', type: 'varchar', length: 254 })
  userEmail!: string;

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date;
}

/** Review notes: comments pinned at panel coordinates, and findings marked checked. */
@Entity({ name: 'revision_comments' })
export class RevisionComment {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Index('idx_revision_comments_revision')
  @Column({ name: 'revision_id', type: 'uuid' })
  revisionId!: string;

  @Column({ type: 'varchar', length: 8 })
  side!: string;

  @Column({ type: 'double precision', nullable: true })
  x!: number | null;

  @Column({ type: 'double precision', nullable: true })
  y!: number | null;

  /** 'comment' or 'checked' (a finding key marked as looked at) */
  @Column({ type: 'varchar', length: 16, default: 'comment' })
  kind!: string;

  @Column({ name: 'finding_key', type: 'varchar', length: 500, nullable: true })
  findingKey!: string | null;

  @Column({ type: 'text' })
  text!: string;

  @Column({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @Column({ name: 'user_email', type: 'varchar', length: 254 })
  userEmail!: string;

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date;
}

/** The released neutral placement lists, byte for byte. */
@Entity({ name: 'release_files' })
@Index('uq_release_files', ['revisionId', 'side', 'format'], { unique: true })
export class ReleaseFile {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'revision_id', type: 'uuid' })
  revisionId!: string;

  @Column({ type: 'varchar', length: 8 })
  side!: string;

  /** 'csv' | 'json' */
  @Column({ type: 'varchar', length: 8 })
  format!: string;

  @Column({ type: 'bytea' })
  bytes!: Buffer;

  @Column({ type: 'varchar', length: 64 })
  sha256!: string;

  @Column({ type: 'integer' })
  placements!: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}

/** Read-only tokens for line computers: they fetch released run files and nothing else. */
@Entity({ name: 'api_tokens' })
export class ApiToken {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 80 })
  name!: string;

  /** The first characters, shown to tell tokens apart. */
  @Column({ type: 'varchar', length: 16 })
  prefix!: string;

  /** SHA-256 of the whole token; the token itself is shown once and never stored. */
  @Index('uq_api_tokens_hash', { unique: true })
  @Column({ name: 'token_hash', type: 'varchar', length: 64 })
  tokenHash!: string;

  @Column({ name: 'created_by', type: 'uuid' })
  createdBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @Column({ name: 'last_used_at', type: 'timestamptz', nullable: true })
  lastUsedAt!: Date | null;

  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true })
  revokedAt!: Date | null;
}

/** An operator's report of a problem with a released run file. */
@Entity({ name: 'problem_reports' })
export class ProblemReport {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'revision_id', type: 'uuid' })
  revisionId!: string;

  @Column({ name: 'user_id', type: 'uuid' })
  userId!: string;

  @Column({ name: 'user_email', type: 'varchar', length: 254 })
  userEmail!: string;

  @Column({ type: 'text' })
  text!: string;

  @CreateDateColumn({ type: 'timestamptz' })
  at!: Date;
}
