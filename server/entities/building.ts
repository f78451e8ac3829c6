import { Column, Entity, Index } from 'typeorm';
import { SyncColumns } from './sync-columns';

@Entity('building')
@Index('ix_building_organisation', ['organisationId'])
export class Building extends SyncColumns {
  @Column('uuid', { name: 'organisation_id' })
  organisationId: string;

  @Column('text')
  name: string;

  @Column('text', { default: '' })
  address: string;

  @Column('text', { default: '' })
  notes: string;
}
