import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import { LibraryPackage } from './library-package.entity';

/** A footprint name, or a `*`/`?` pattern, that resolves to a package. */
@Entity({ name: 'library_aliases' })
export class LibraryAlias {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 200 })
  pattern!: string;

  /** lower(pattern): unique across the library (one footprint → one package). */
  @Index('uq_library_aliases_pattern_key', { unique: true })
  @Column({ name: 'pattern_key', type: 'varchar', length: 200 })
  patternKey!: string;

  @Index('idx_library_aliases_package')
  @Column({ name: 'package_id', type: 'uuid' })
  packageId!: string;

  @ManyToOne(() => LibraryPackage, (p) => p.aliases, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'package_id' })
  package?: LibraryPackage;

  @Column({ name: 'updated_by', type: 'varchar', length: 254, nullable: true })
  updatedBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;

  @VersionColumn({ type: 'integer', default: 1 })
  version!: number;
}
