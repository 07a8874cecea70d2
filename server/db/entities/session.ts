import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Patch } from '../../../shared/patch/patch-schema';

/** One live, shared design space for one string, in a studio. */
@Entity('sessions')
export class Session {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar' })
  studioId!: string;

  @Column({ type: 'varchar' })
  name!: string;

  /** The current patch, as validated JSON; kept fresh for the REST API and the command line. */
  @Column({ type: 'simple-json' })
  patch!: Patch;

  /** The collaborative document state (collaboration layer). */
  @Column({ type: 'blob', nullable: true })
  docState!: Buffer | null;

  @Column({ type: 'varchar', nullable: true })
  createdById!: string | null;

  @Column({ type: 'varchar', nullable: true })
  updatedById!: string | null;

  @Column({ type: 'boolean', default: false })
  archived!: boolean;

  /** The preset this session was started from, loaded from or saved as; "Update preset" writes to it. Deleting the preset clears it (no foreign key, so the migration can be undone). */
  @Column({ type: 'varchar', nullable: true })
  sourcePresetId!: string | null;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime' })
  updatedAt!: Date;
}
