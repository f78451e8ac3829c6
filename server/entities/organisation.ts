import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

@Entity('organisation')
export class Organisation {
  @PrimaryColumn('uuid')
  id: string;

  @Column('text')
  name: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
