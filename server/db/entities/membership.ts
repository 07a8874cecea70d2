import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '../../../shared/access/roles';

/** A person's role in one studio. One row per (user, studio). */
@Entity('memberships')
export class Membership {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar' })
  userId!: string;

  @Column({ type: 'varchar' })
  studioId!: string;

  @Column({ type: 'varchar' })
  role!: Role;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;
}
