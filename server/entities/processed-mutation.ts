import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

/** A pushed mutation id with the answer it got, so a replay is answered `duplicate`. */
@Entity('processed_mutation')
export class ProcessedMutation {
  @PrimaryColumn('text', { name: 'device_id', primaryKeyConstraintName: 'pk_processed_mutation' })
  deviceId: string;

  @PrimaryColumn('uuid', { name: 'mutation_id', primaryKeyConstraintName: 'pk_processed_mutation' })
  mutationId: string;

  /** first in the key: an account only ever meets its own records (migration 1765420000000) */
  @PrimaryColumn('uuid', { name: 'user_id', primaryKeyConstraintName: 'pk_processed_mutation' })
  userId: string;

  @Column('jsonb', { nullable: true })
  result: unknown;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
