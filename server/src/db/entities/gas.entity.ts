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
import { GasVersion } from './gas-version.entity.js';
import { Study } from './study.entity.js';
import { User } from './user.entity.js';

/** A gas definition kept in a study; its specs live in numbered versions. */
@Entity('gas')
@Index('IDX_gas_study', ['study'])
export class Gas {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Study, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'study_id' })
  study!: Relation<Study>;

  @Column('varchar', { length: 200 })
  title!: string;

  /** Number of the newest version (1 for a new gas). */
  @Column('integer', { name: 'current_version' })
  currentVersion!: number;

  /** Soft delete: the gas leaves the lists; its versions and runs stay readable by id. */
  @Column('boolean', { default: false })
  deleted!: boolean;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'updated_by_id' })
  updatedBy!: Relation<User>;

  @OneToMany(() => GasVersion, (version) => version.gas)
  versions!: Relation<GasVersion[]>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;

  @Column('varchar', { name: 'updated_at', length: 30 })
  updatedAt!: string;
}
