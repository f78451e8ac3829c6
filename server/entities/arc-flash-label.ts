import { Column, Entity, Index } from 'typeorm';
import { SyncColumns } from './sync-columns';

/** What a panel's arc-flash study found, as its label shows it (shared/arc-flash.ts). */
@Entity('arc_flash_label')
@Index('ix_arc_flash_label_building_version', ['buildingId', 'version'])
@Index('ix_arc_flash_label_panel', ['panelId'])
export class ArcFlashLabel extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('uuid', { name: 'panel_id' })
  panelId: string;

  @Column('text', { name: 'study_date' })
  studyDate: string;

  @Column('double precision', { name: 'incident_energy_cal_cm2', nullable: true })
  incidentEnergyCalCm2: number | null;

  @Column('integer', { name: 'ppe_category', nullable: true })
  ppeCategory: number | null;

  @Column('double precision', { name: 'boundary_in' })
  boundaryIn: number;

  @Column('double precision', { name: 'working_distance_in' })
  workingDistanceIn: number;

  @Column('double precision', { name: 'nominal_v' })
  nominalV: number;

  @Column('text', { name: 'study_by' })
  studyBy: string;
}
