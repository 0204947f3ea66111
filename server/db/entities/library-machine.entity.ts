import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

/** A placement machine's profile: reach and installed nozzles (mm). */
@Entity({ name: 'library_machines' })
// Names are unique without case: a unique index on lower(name), written in the migration.
@Index('uq_library_machines_name_ci', { synchronize: false })
export class LibraryMachine {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', length: 60 })
  name!: string;

  @Column({ name: 'reach_x', type: 'double precision' })
  reachX!: number;

  @Column({ name: 'reach_y', type: 'double precision' })
  reachY!: number;

  @Column({ type: 'text', array: true, default: () => "'{}'" })
  nozzles!: string[];

  @Column({ name: 'max_part_height', type: 'double precision' })
  maxPartHeight!: number;

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
