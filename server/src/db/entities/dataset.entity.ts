import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { Run } from './run.entity.js';
import { Study } from './study.entity.js';
import { User } from './user.entity.js';

/** Where a dataset is in its life: draft -> in_review -> locked, or withdrawn. */
export type DatasetState = 'draft' | 'in_review' | 'locked' | 'withdrawn';

/**
 * A frozen snapshot of a finished run (spec version, result, comparisons) on its way to being
 * locked. Database triggers refuse UPDATE and DELETE of a row once its state is `locked`.
 */
@Entity('dataset')
@Index('IDX_dataset_study', ['study'])
@Index('IDX_dataset_hash', ['hash'])
export class Dataset {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Study, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'study_id' })
  study!: Relation<Study>;

  @ManyToOne(() => Run, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'run_id' })
  run!: Relation<Run>;

  /** 1 for a first dataset, previous + 1 for one that supersedes another. */
  @Column('integer')
  version!: number;

  @ManyToOne(() => Dataset, { nullable: true, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'supersedes_id' })
  supersedes!: Relation<Dataset> | null;

  @Column('varchar', { length: 200 })
  title!: string;

  @Column('text', { default: '' })
  description!: string;

  @Column('varchar', { length: 16 })
  state!: DatasetState;

  /**
   * JSON list of user ids: the citation's authors as chosen before the lock; null = the default
   * (the maker, then the approving reviewers). The lock copies the people into the document.
   */
  @Column('text', { nullable: true })
  authors!: string | null;

  /** SHA-256 (hex) of `canonical`; set when locked. */
  @Column('varchar', { length: 64, nullable: true })
  hash!: string | null;

  @Column('varchar', { name: 'locked_at', length: 30, nullable: true })
  lockedAt!: string | null;

  @ManyToOne(() => User, { nullable: true, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'locked_by_id' })
  lockedBy!: Relation<User> | null;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;

  @Column('varchar', { name: 'updated_at', length: 30 })
  updatedAt!: string;

  // The two byte columns are the table's last (migration DatasetBytesLast): SQLite reads a column
  // stored after a large value only by walking that value's overflow pages.

  /**
   * JSON text: `{spec, gas, run, result, comparisons}` as taken from the run. Tens of megabytes
   * for a large class table: never read with the row (`select: false`, see `withBytes`).
   */
  @Column('text', { select: false })
  snapshot!: string;

  /**
   * The RFC 8785 canonical JSON that was hashed; the JSON export answers exactly these bytes.
   * As large as the snapshot: never read with the row (`select: false`, see `withBytes`).
   */
  @Column('text', { nullable: true, select: false })
  canonical!: string | null;
}
