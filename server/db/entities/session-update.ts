import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One collaborative document update of a session, appended as it arrives and folded into the snapshot later. */
@Entity('session_updates')
export class SessionUpdate {
  @PrimaryGeneratedColumn({ type: 'integer' })
  id!: number;

  @Column({ type: 'varchar' })
  sessionId!: string;

  @Column({ type: 'blob' })
  update!: Buffer;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;
}
