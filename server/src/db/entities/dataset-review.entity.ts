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
import { Dataset } from './dataset.entity.js';
import { User } from './user.entity.js';

/** A request that one reviewer review one dataset. */
@Entity('dataset_review_request')
@Unique('UQ_dataset_review_request', ['dataset', 'reviewer'])
export class DatasetReviewRequest {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Dataset, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset!: Relation<Dataset>;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'reviewer_id' })
  reviewer!: Relation<User>;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'requested_by_id' })
  requestedBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}

/** A reviewer's verdict on a dataset, with a comment. */
@Entity('dataset_review')
@Index('IDX_dataset_review_dataset', ['dataset'])
export class DatasetReview {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Dataset, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset!: Relation<Dataset>;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'reviewer_id' })
  reviewer!: Relation<User>;

  @Column('varchar', { length: 16 })
  verdict!: 'approve' | 'changes';

  @Column('text', { default: '' })
  comment!: string;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}

/** A comment on a dataset, or on one row N of it. */
@Entity('dataset_comment')
@Index('IDX_dataset_comment_dataset', ['dataset'])
export class DatasetComment {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Dataset, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset!: Relation<Dataset>;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'author_id' })
  author!: Relation<User>;

  /** The row commented on; null for the dataset as a whole. */
  @Column('integer', { name: 'row_n', nullable: true })
  rowN!: number | null;

  @Column('text')
  body!: string;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}

/** A steward's written reason for accepting a check that fails (one row N of it, or all of it). */
@Entity('dataset_waiver')
@Index('IDX_dataset_waiver_dataset', ['dataset'])
export class DatasetWaiver {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Dataset, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset!: Relation<Dataset>;

  /** The check's key, e.g. `grand` or `comparison:<id>`. */
  @Column('varchar', { name: 'check_key', length: 64 })
  check!: string;

  /** The row waived; null waives every row of the check. */
  @Column('integer', { name: 'row_n', nullable: true })
  rowN!: number | null;

  @Column('text')
  reason!: string;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'waived_by_id' })
  waivedBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
