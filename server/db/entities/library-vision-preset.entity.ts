import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { Lighting, VisionMethod } from '../../../shared/schemas/library.schema';

/** How the up-looking camera centres a part (our own fields). */
@Entity({ name: 'library_vision_presets' })
// Names are unique without case: a unique index on lower(name), written in the migration.
@Index('uq_library_vision_presets_name_ci', { synchronize: false })
export class LibraryVisionPreset {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 60 })
  name!: string;

  @Column({ type: 'varchar', length: 20 })
  method!: VisionMethod;

  @Column({ type: 'varchar', length: 10 })
  lighting!: Lighting;

  @Column({ name: 'size_tolerance_pct', type: 'double precision' })
  sizeTolerancePct!: number;

  @Column({ name: 'max_centring_offset', type: 'double precision' })
  maxCentringOffset!: number;

  @Column({ name: 'max_angle_correction', type: 'double precision' })
  maxAngleCorrection!: number;

  @Column({ type: 'text', default: '' })
  notes!: string;

  @Column({ name: 'updated_by', type: 'varchar', length: 254, nullable: true })
  updatedBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt!: Date;

  @VersionColumn({ type: 'integer', default: 1 })
  version!: number;
}
