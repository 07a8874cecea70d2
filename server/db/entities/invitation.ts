import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '../../../shared/access/roles';

/** An e-mailed offer to join a studio in a role; the token itself is never stored, only its hash. */
@Entity('invitations')
export class Invitation {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar' })
  studioId!: string;

  @Column({ type: 'varchar' })
  email!: string;

  @Column({ type: 'varchar' })
  role!: Role;

  @Column({ type: 'varchar', unique: true })
  tokenHash!: string;

  @Column({ type: 'datetime' })
  expiresAt!: Date;

  @Column({ type: 'datetime', nullable: true })
  acceptedAt!: Date | null;

  @Column({ type: 'datetime', nullable: true })
  revokedAt!: Date | null;

  @Column({ type: 'varchar', nullable: true })
  invitedById!: string | null;

  @Column({ type: 'datetime' })
  sentAt!: Date;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;
}
