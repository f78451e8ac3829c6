import { Column } from 'typeorm';
import type { FieldMeta } from '../../shared/merge';

/**
 * Columns every synced row carries (SYNC.md): a client-made UUIDv7 id, the hybrid logical clock
 * stamp of the last write, who wrote it, a tombstone and the server version pull cursors use.
 */
export abstract class SyncColumns {
  @Column('uuid', { primary: true })
  id: string;

  /** HLC stamp of the last write; sorts as text */
  @Column('text', { name: 'updated_at' })
  updatedAt: string;

  @Column('uuid', { name: 'updated_by', nullable: true })
  updatedBy: string | null;

  @Column('timestamptz', { name: 'deleted_at', nullable: true })
  deletedAt: Date | null;

  /** bigint from the building's version counter; pg returns it as a string */
  @Column('bigint', { default: 0 })
  version: string;

  /** per-field { hlc, version, device, user } for last-writer-wins merges (shared/merge.ts) */
  @Column('jsonb', { name: 'field_meta', default: () => "'{}'::jsonb" })
  fieldMeta: FieldMeta;
}
