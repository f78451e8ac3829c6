import { Column, Entity, Index } from 'typeorm';
import type { InspectionKind } from '../../shared/records';
import { SyncColumns } from './sync-columns';

/** An inspection of one panel, or a round over several panels of a building. */
@Entity('inspection')
@Index('ix_inspection_building_version', ['buildingId', 'version'])
export class Inspection extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('text')
  kind: InspectionKind;

  @Column('jsonb', { name: 'panel_ids' })
  panelIds: string[];

  @Column('text', { name: 'performed_on' })
  performedOn: string;

  @Column('double precision', { name: 'ambient_c', nullable: true })
  ambientC: number | null;

  @Column('double precision', { name: 'load_pct', nullable: true })
  loadPct: number | null;

  @Column('text', { default: '' })
  notes: string;

  @Column('uuid', { name: 'inspector_id', nullable: true })
  inspectorId: string | null;

  @Column('text', { name: 'inspector_name', default: '' })
  inspectorName: string;

  /** the sign-off; once set the inspection and its readings are frozen */
  @Column('timestamptz', { name: 'signed_at', nullable: true })
  signedAt: Date | null;

  @Column('uuid', { name: 'signed_by', nullable: true })
  signedBy: string | null;

  @Column('text', { name: 'signed_by_name', nullable: true })
  signedByName: string | null;
}
