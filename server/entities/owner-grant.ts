import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** An owner-role user may read this building (and no other of the organisation). */
@Entity('owner_grant')
@Index('uq_owner_grant_user_building', ['userId', 'buildingId'], { unique: true })
export class OwnerGrant {
  @PrimaryColumn('uuid')
  id: string;

  @Column('uuid', { name: 'user_id' })
  userId: string;

  @Column('uuid', { name: 'building_id' })
  buildingId: string;
}
