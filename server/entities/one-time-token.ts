import { Column, CreateDateColumn, Entity, Index, PrimaryColumn } from 'typeorm';

/** A password-reset link; only the SHA-256 of its token is kept. */
@Entity('one_time_token')
@Index('uq_one_time_token_hash', ['tokenHash'], { unique: true })
export class OneTimeToken {
  @PrimaryColumn('uuid')
  id: string;

  @Column('uuid', { name: 'user_id' })
  userId: string;

  @Column('text')
  purpose: 'password_reset';

  @Column('text', { name: 'token_hash' })
  tokenHash: string;

  @Column('timestamptz', { name: 'expires_at' })
  expiresAt: Date;

  @Column('timestamptz', { name: 'used_at', nullable: true })
  usedAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
