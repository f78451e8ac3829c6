import { Column, CreateDateColumn, Entity, Index, PrimaryColumn } from 'typeorm';

@Entity('app_user')
@Index('uq_app_user_email', ['email'], { unique: true })
export class User {
  @PrimaryColumn('uuid')
  id: string;

  /** stored lower-cased */
  @Column('text')
  email: string;

  @Column('text')
  name: string;

  @Column('text', { name: 'password_hash', select: false })
  passwordHash: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
