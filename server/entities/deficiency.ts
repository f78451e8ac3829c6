import { Column, Entity, Index } from 'typeorm';
import type { DeficiencyFields } from '../../shared/records';
import { SyncColumns } from './sync-columns';

/** Something found wrong, from a reading, the visual checklist or by hand, until verified. */
@Entity('deficiency')
@Index('ix_deficiency_building_version', ['buildingId', 'version'])
@Index('ix_deficiency_building_status', ['buildingId', 'status'])
export class Deficiency extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('uuid', { name: 'panel_id', nullable: true })
  panelId: string | null;

  @Column('uuid', { name: 'circuit_id', nullable: true })
  circuitId: string | null;

  @Column('uuid', { name: 'inspection_id', nullable: true })
  inspectionId: string | null;

  @Column('uuid', { name: 'reading_id', nullable: true })
  readingId: string | null;

  @Column('text')
  source: DeficiencyFields['source'];

  @Column('text', { name: 'check_item', nullable: true })
  check: DeficiencyFields['check'];

  @Column('text')
  title: string;

  @Column('text', { default: '' })
  description: string;

  @Column('smallint')
  priority: DeficiencyFields['priority'];

  @Column('text', { name: 'priority_reason', default: '' })
  priorityReason: string;

  @Column('text', { name: 'due_on' })
  dueOn: string;

  @Column('text')
  status: DeficiencyFields['status'];

  @Column('uuid', { name: 'assignee_id', nullable: true })
  assigneeId: string | null;

  @Column('text', { name: 'repair_note', default: '' })
  repairNote: string;

  @Column('text', { name: 'defer_reason', default: '' })
  deferReason: string;

  @Column('text', { name: 'review_on', nullable: true })
  reviewOn: string | null;

  @Column('text', { name: 'accepted_at', nullable: true })
  acceptedAt: string | null;

  @Column('uuid', { name: 'raised_by', nullable: true })
  raisedBy: string | null;

  @Column('text', { name: 'raised_by_name', default: '' })
  raisedByName: string;
}
