import { Column, Entity, Index, PrimaryColumn } from 'typeorm';
import type { Role } from '../../shared/domain';

/** A user's role in one organisation. */
@Entity('membership')
@Index('uq_membership_user_org', ['userId', 'organisationId'], { unique: true })
export class Membership {
  @PrimaryColumn('uuid')
  id: string;

  @Column('uuid', { name: 'user_id' })
  userId: string;

  @Column('uuid', { name: 'organisation_id' })
  organisationId: string;

  @Column('text')
  role: Role;
}
