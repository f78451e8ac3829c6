import { Column, Entity, Index } from 'typeorm';
import type { ConflictEntity } from '../../shared/sync';
import { SyncColumns } from './sync-columns';

/**
 * A losing write kept for review (SYNC.md): which field of which row, both values, both stamps,
 * who, and how it was resolved. Synced down like any row of the building.
 */
@Entity('conflict_log')
@Index('ix_conflict_log_building_version', ['buildingId', 'version'])
@Index('ix_conflict_log_entity', ['entityId'])
export class ConflictLog extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('text')
  entity: ConflictEntity;

  @Column('uuid', { name: 'entity_id' })
  entityId: string;

  /** a field, a group joined with '+', or the edited fields joined with ',' */
  @Column('text')
  field: string;

  @Column('jsonb', { name: 'winner_value', nullable: true })
  winnerValue: Record<string, unknown> | null;

  @Column('jsonb', { name: 'loser_value', nullable: true })
  loserValue: Record<string, unknown> | null;

  @Column('text', { name: 'winner_hlc' })
  winnerHlc: string;

  @Column('text', { name: 'loser_hlc' })
  loserHlc: string;

  @Column('uuid', { name: 'winner_user', nullable: true })
  winnerUser: string | null;

  @Column('uuid', { name: 'loser_user', nullable: true })
  loserUser: string | null;

  @Column('text', { name: 'loser_device' })
  loserDevice: string;

  @Column('uuid', { name: 'mutation_id', nullable: true })
  mutationId: string | null;

  @Column('text')
  kind: 'concurrent' | 'edited_after_delete';

  @Column('text', { nullable: true })
  resolution: 'kept_theirs' | 'restored_mine' | null;
}
