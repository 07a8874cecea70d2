import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Patch } from '../../../shared/patch/patch-schema';

/** A named, tagged, versioned snapshot of a patch in a studio's library. */
@Entity('presets')
export class Preset {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar' })
  studioId!: string;

  @Column({ type: 'varchar' })
  name!: string;

  @Column({ type: 'simple-json' })
  tags!: string[];

  @Column({ type: 'varchar', default: '' })
  description!: string;

  @Column({ type: 'simple-json' })
  patch!: Patch;

  /** 1 when saved; raised each time the patch itself changes. */
  @Column({ type: 'integer', default: 1 })
  version!: number;

  @Column({ type: 'varchar', nullable: true })
  createdById!: string | null;

  @Column({ type: 'varchar', nullable: true })
  sourceSessionId!: string | null;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime' })
  updatedAt!: Date;
}
