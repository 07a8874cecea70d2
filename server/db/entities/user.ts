import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A person with an account. E-mail is stored case-folded and is unique. */
@Entity('users')
export class User {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar', unique: true })
  email!: string;

  @Column({ type: 'varchar' })
  displayName!: string;

  @Column({ type: 'varchar' })
  passwordHash!: string;

  /** Raised on password change and sign-out everywhere: tokens carrying an older value are refused. */
  @Column({ type: 'integer', default: 0 })
  tokenVersion!: number;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;

  @Column({ type: 'datetime', nullable: true })
  lastSeenAt!: Date | null;
}
