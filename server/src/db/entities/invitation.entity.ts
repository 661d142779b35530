import {
  Column,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { Role } from '@traceloom/shared/api';
import { User } from './user.entity.js';

/** A record that an admin invited someone; the mail itself comes later. */
@Entity('invitation')
export class Invitation {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column('varchar', { length: 254 })
  email!: string;

  @Column('varchar', { length: 16 })
  role!: Role;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'invited_by_id' })
  invitedBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;

  @Column('varchar', { name: 'accepted_at', length: 30, nullable: true })
  acceptedAt!: string | null;
}
