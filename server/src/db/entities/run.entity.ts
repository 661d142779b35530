import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { GasVersion } from './gas-version.entity.js';
import { Gas } from './gas.entity.js';
import { User } from './user.entity.js';

/** Where a run is in its life. */
export type RunStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

/** One computation job of one exact gas version. */
@Entity('run')
@Index('IDX_run_gas', ['gas'])
@Index('IDX_run_status', ['status'])
export class Run {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Gas, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'gas_id' })
  gas!: Relation<Gas>;

  @ManyToOne(() => GasVersion, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'gas_version_id' })
  gasVersion!: Relation<GasVersion>;

  @Column('varchar', { length: 16 })
  status!: RunStatus;

  @Column('integer', { name: 'progress_done', default: 0 })
  progressDone!: number;

  @Column('integer', { name: 'progress_total', default: 0 })
  progressTotal!: number;

  @Column('varchar', { name: 'progress_phase', length: 32, default: '' })
  progressPhase!: string;

  /** gzip (RFC 1952) of the result JSON without class rows (those are in `run_class_page`). */
  @Column('blob', { nullable: true })
  result!: Buffer | null;

  /** `{N: count}` of class rows, so answers can name them without unpacking the result. */
  @Column('text', { name: 'class_counts', nullable: true })
  classCounts!: string | null;

  /** Times this run was put back in the queue after a server restart. */
  @Column('integer', { default: 0 })
  requeues!: number;

  @Column('varchar', { name: 'started_at', length: 30, nullable: true })
  startedAt!: string | null;

  @Column('varchar', { name: 'finished_at', length: 30, nullable: true })
  finishedAt!: string | null;

  @Column('integer', { name: 'duration_ms', nullable: true })
  durationMs!: number | null;

  @Column('text', { nullable: true })
  error!: string | null;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
