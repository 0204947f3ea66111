import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

/** A pick-up nozzle; diameters and holder radius in mm. */
@Entity({ name: 'library_nozzles' })
// Names are unique without case: a unique index on lower(name), written in the migration.
@Index('uq_library_nozzles_name_ci', { synchronize: false })
export class LibraryNozzle {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 40 })
  name!: string;

  @Column({ name: 'tip_outer', type: 'double precision' })
  tipOuter!: number;

  @Column({ name: 'tip_inner', type: 'double precision', nullable: true })
  tipInner!: number | null;

  @Column({ name: 'holder_radius', type: 'double precision' })
  holderRadius!: number;

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
