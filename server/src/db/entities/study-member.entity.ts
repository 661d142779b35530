import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  Unique,
  type Relation,
} from 'typeorm';
import { Study } from './study.entity.js';
import { User } from './user.entity.js';

/** A person's membership of a study (the owner is not listed here). */
@Entity('study_member')
@Unique('UQ_study_member_pair', ['study', 'user'])
@Index('IDX_study_member_user', ['user'])
export class StudyMember {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Study, (study) => study.members, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'study_id' })
  study!: Relation<Study>;

  @ManyToOne(() => User, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user!: Relation<User>;

  @Column('varchar', { name: 'added_at', length: 30 })
  addedAt!: string;
}
