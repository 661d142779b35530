import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  OneToMany,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { User } from './user.entity.js';
import { StudyMember } from './study-member.entity.js';

/** A team's workspace. */
@Entity('study')
@Index('IDX_study_owner', ['owner'])
export class Study {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column('varchar', { length: 200 })
  title!: string;

  @Column('text', { default: '' })
  description!: string;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'owner_id' })
  owner!: Relation<User>;

  @OneToMany(() => StudyMember, (member) => member.study)
  members!: Relation<StudyMember[]>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;

  @Column('varchar', { name: 'updated_at', length: 30 })
  updatedAt!: string;
}
