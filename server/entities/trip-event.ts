import { Column, Entity, Index } from 'typeorm';
import { SyncColumns } from './sync-columns';

/** An unexpected trip of a circuit, as someone recorded it. */
@Entity('trip_event')
@Index('ix_trip_event_building_version', ['buildingId', 'version'])
@Index('ix_trip_event_circuit', ['circuitId'])
export class TripEvent extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('uuid', { name: 'panel_id' })
  panelId: string;

  @Column('uuid', { name: 'circuit_id' })
  circuitId: string;

  @Column('timestamptz', { name: 'occurred_at' })
  occurredAt: Date;

  @Column('double precision', { name: 'load_a', nullable: true })
  loadA: number | null;

  @Column('text', { default: '' })
  circumstances: string;
}
