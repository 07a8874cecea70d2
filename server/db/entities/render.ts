import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Patch } from '../../../shared/patch/patch-schema';
import type { NoteSetSpec, RenderOutput, RenderState } from '../../../shared/renders/render-settings';

/** One export: who asked for what, the patch snapshot it was made from, and the file it made. */
@Entity('renders')
export class Render {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar' })
  studioId!: string;

  @Column({ type: 'varchar' })
  kind!: 'single' | 'noteSet';

  @Column({ type: 'varchar' })
  name!: string;

  @Column({ type: 'varchar' })
  state!: RenderState;

  @Column({ type: 'integer', default: 0 })
  progressPercent!: number;

  @Column({ type: 'varchar' })
  sourceKind!: 'session' | 'preset';

  @Column({ type: 'varchar' })
  sourceId!: string;

  @Column({ type: 'varchar' })
  sourceName!: string;

  /** Set for session renders, so the renders page can filter by session. */
  @Column({ type: 'varchar', nullable: true })
  sessionId!: string | null;

  @Column({ type: 'simple-json' })
  output!: RenderOutput;

  @Column({ type: 'simple-json', nullable: true })
  noteSet!: NoteSetSpec | null;

  /** The patch as it was when the render was asked for. */
  @Column({ type: 'simple-json' })
  patch!: Patch;

  /** File name under the renders folder, once written. */
  @Column({ type: 'varchar', nullable: true })
  fileName!: string | null;

  /** Bytes on disk; while a job runs, its estimate counts against the quota. */
  @Column({ type: 'integer', nullable: true })
  sizeBytes!: number | null;

  @Column({ type: 'integer', default: 0 })
  estimatedBytes!: number;

  @Column({ type: 'real', nullable: true })
  durationS!: number | null;

  @Column({ type: 'real', nullable: true })
  peakDbfs!: number | null;

  @Column({ type: 'real', nullable: true })
  truePeakDbtp!: number | null;

  @Column({ type: 'real', nullable: true })
  integratedLufs!: number | null;

  @Column({ type: 'integer', nullable: true })
  fileCount!: number | null;

  /** Set when the level is not what the settings asked for (true-peak ceiling, too short for loudness). */
  @Column({ type: 'varchar', nullable: true })
  levellingNote!: string | null;

  @Column({ type: 'varchar', nullable: true })
  error!: string | null;

  @Column({ type: 'varchar', nullable: true })
  createdById!: string | null;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;

  @Column({ type: 'datetime', nullable: true })
  finishedAt!: Date | null;
}
