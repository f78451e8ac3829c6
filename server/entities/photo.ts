import { Column, Entity, Index } from 'typeorm';
import type { PhotoCreateBody } from '../../shared/records';
import { SyncColumns } from './sync-columns';

/**
 * A photo's row: synced like any other. The bytes live in object storage under keys made from the
 * id (server/services/photo-store.ts), never a path in the row; `uploaded` is set by the upload.
 */
@Entity('photo')
@Index('ix_photo_building_version', ['buildingId', 'version'])
@Index('ix_photo_parent', ['parentId'])
export class Photo extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('text', { name: 'parent_kind' })
  parentKind: PhotoCreateBody['parentKind'];

  @Column('uuid', { name: 'parent_id' })
  parentId: string;

  @Column('text')
  purpose: PhotoCreateBody['purpose'];

  @Column('text')
  sha256: string;

  @Column('integer')
  bytes: number;

  @Column('text', { name: 'content_type' })
  contentType: PhotoCreateBody['contentType'];

  @Column('integer', { nullable: true })
  width: number | null;

  @Column('integer', { nullable: true })
  height: number | null;

  @Column('timestamptz', { name: 'taken_at' })
  takenAt: Date;

  @Column('text', { default: '' })
  caption: string;

  @Column('boolean', { default: false })
  uploaded: boolean;
}
