import { Column, CreateDateColumn, Entity, Index, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { FeederKind, PackageFamily } from '../../../shared/schemas/library.schema';
import { LibraryAlias } from './library-alias.entity';

/** A package of the shared library. Sizes in mm, angles in degrees. */
@Entity({ name: 'library_packages' })
export class LibraryPackage {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 100 })
  name!: string;

  /** lower(name): the name is unique case-insensitively. */
  @Index('uq_library_packages_name_key', { unique: true })
  @Column({ name: 'name_key', type: 'varchar', length: 100 })
  nameKey!: string;

  @Column({ type: 'varchar', length: 20 })
  family!: PackageFamily;

  @Column({ name: 'body_length', type: 'double precision' })
  bodyLength!: number;

  @Column({ name: 'body_width', type: 'double precision' })
  bodyWidth!: number;

  @Column({ name: 'body_height', type: 'double precision' })
  bodyHeight!: number;

  @Column({ name: 'offset_x', type: 'double precision', default: 0 })
  offsetX!: number;

  @Column({ name: 'offset_y', type: 'double precision', default: 0 })
  offsetY!: number;

  @Column({ type: 'double precision', default: 0.25 })
  courtyard!: number;

  @Column({ name: 'rotation_offset', type: 'double precision', default: 0 })
  rotationOffset!: number;

  @Column({ type: 'boolean', default: false })
  polarised!: boolean;

  @Column({ type: 'boolean', default: false })
  overhang!: boolean;

  /** Nozzle names, preferred first. */
  @Column({ type: 'text', array: true, default: () => "'{}'" })
  nozzles!: string[];

  /** Vision preset name. */
  @Column({ type: 'varchar', length: 60, nullable: true })
  vision!: string | null;

  @Column({ name: 'tape_width', type: 'double precision', nullable: true })
  tapeWidth!: number | null;

  @Column({ name: 'tape_pitch', type: 'double precision', nullable: true })
  tapePitch!: number | null;

  @Column({ type: 'varchar', length: 10, default: 'tape' })
  feeder!: FeederKind;

  @Column({ name: 'pad_length', type: 'double precision', nullable: true })
  padLength!: number | null;

  @Column({ name: 'pad_width', type: 'double precision', nullable: true })
  padWidth!: number | null;

  @Column({ name: 'pad_count', type: 'integer', nullable: true })
  padCount!: number | null;

  @Column({ type: 'text', default: '' })
  notes!: string;

  @OneToMany(() => LibraryAlias, (a) => a.package)
  aliases?: LibraryAlias[];

  @Column({ name: 'updated_by', type: 'varchar', length: 254, nullable: true })
  updatedBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;

  @VersionColumn({ type: 'integer', default: 1 })
  version!: number;
}
