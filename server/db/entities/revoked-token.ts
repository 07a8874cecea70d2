import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A signed-out token (by its `jti`), refused until it would have expired anyway; then the row is pruned. */
@Entity('revoked_tokens')
export class RevokedToken {
  @PrimaryColumn({ type: 'varchar' })
  jti!: string;

  @Column({ type: 'varchar' })
  userId!: string;

  /** When the token itself expires; after this the row is no longer needed. */
  @Column({ type: 'datetime' })
  expiresAt!: Date;

  @Column({ type: 'datetime' })
  revokedAt!: Date;
}
