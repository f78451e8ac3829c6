import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';
import type { OrganisationSettings } from '../../shared/records';

@Entity('organisation')
export class Organisation {
  @PrimaryColumn('uuid')
  id: string;

  @Column('text')
  name: string;

  /** due days by priority, photo location policy; missing keys take DEFAULT_SETTINGS */
  @Column('jsonb', { default: () => "'{}'::jsonb" })
  settings: Partial<OrganisationSettings>;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
