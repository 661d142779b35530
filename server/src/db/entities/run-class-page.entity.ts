import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Run } from './run.entity.js';

/**
 * One page of a finished run's class table: up to `CLASS_PAGE_ROWS` rows of one N, stored as the
 * gzip (RFC 1952) of their JSON array text. Rows stream out of the worker into this table while
 * the run computes, so neither the worker nor the server holds the whole class table, and an
 * answer reads only the pages it needs.
 */
@Entity('run_class_page')
export class RunClassPage {
  @PrimaryColumn('varchar', { name: 'run_id' })
  runId!: string;

  @PrimaryColumn('integer')
  n!: number;

  @PrimaryColumn('integer')
  page!: number;

  @Column('integer', { name: 'row_count' })
  rowCount!: number;

  @Column('blob')
  rows!: Buffer;

  @ManyToOne(() => Run, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'run_id' })
  run!: Relation<Run>;
}
