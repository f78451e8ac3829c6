import { Column, CreateDateColumn, Entity, Index, PrimaryColumn } from 'typeorm';
import type { Role } from '../../shared/domain';

/** An e-mailed invitation to an organisation; only the SHA-256 of its one-time token is kept. */
@Entity('invitation')
@Index('uq_invitation_token_hash', ['tokenHash'], { unique: true })
export class Invitation {
  @PrimaryColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organisation_id' })
  organisationId: string;

  /** stored lower-cased */
  @Column('text')
  email: string;

  @Column('text')
  role: Role;

  /** buildings granted when an owner accepts */
  @Column('uuid', { name: 'building_ids', array: true, default: () => "'{}'" })
  buildingIds: string[];

  @Column('uuid', { name: 'invited_by' })
  invitedBy: string;

  @Column('text', { name: 'token_hash' })
  tokenHash: string;

  @Column('timestamptz', { name: 'expires_at' })
  expiresAt: Date;

  @Column('timestamptz', { name: 'used_at', nullable: true })
  usedAt: Date | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
