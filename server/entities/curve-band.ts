import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** A time-current band entered from the maker's published curve; the organisation's library. */
@Entity('curve_band')
@Index('ix_curve_band_organisation', ['organisationId'])
export class CurveBand {
  @PrimaryColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organisation_id' })
  organisationId: string;

  @Column('text')
  label: string;

  @Column('integer', { name: 'rating_a' })
  ratingA: number;

  @Column('text', { default: '' })
  source: string;

  /** [{ multiple, minS, maxS }], rising in multiple */
  @Column('jsonb')
  points: { multiple: number; minS: number; maxS: number }[];

  @Column('double precision', { name: 'instantaneous_multiple', nullable: true })
  instantaneousMultiple: number | null;

  @Column('double precision', { name: 'instantaneous_tolerance_pct', nullable: true })
  instantaneousTolerancePct: number | null;

  @Column('timestamptz', { name: 'updated_at' })
  updatedAt: Date;

  @Column('timestamptz', { name: 'deleted_at', nullable: true })
  deletedAt: Date | null;
}
