import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A signed-out token's id, kept until the token would have expired anyway. */
@Entity('revoked_tokens')
export class RevokedToken {
  @PrimaryColumn({ type: 'varchar', length: 36 })
  jti: string;

  @Column({ name: 'expires_at', type: 'datetime' })
  expiresAt: Date;
}
