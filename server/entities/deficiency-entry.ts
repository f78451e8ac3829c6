import { Column, Entity, Index } from 'typeorm';
import { SyncColumns } from './sync-columns';

/** A line of a deficiency's history: a change the server recorded, or someone's comment. */
@Entity('deficiency_entry')
@Index('ix_deficiency_entry_building_version', ['buildingId', 'version'])
@Index('ix_deficiency_entry_deficiency', ['deficiencyId'])
export class DeficiencyEntry extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('uuid', { name: 'deficiency_id' })
  deficiencyId: string;

  @Column('text')
  kind: 'comment' | 'change';

  @Column('text', { default: '' })
  text: string;

  /** field → [before, after] */
  @Column('jsonb', { default: () => "'{}'::jsonb" })
  changes: Record<string, [unknown, unknown]>;

  @Column('uuid', { name: 'user_id', nullable: true })
  userId: string | null;

  @Column('text', { name: 'user_name', default: '' })
  userName: string;

  @Column('timestamptz')
  at: Date;
}
