import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { ReferenceTable } from './reference-table.entity.js';
import { Run } from './run.entity.js';
import { User } from './user.entity.js';

/** Row verdicts of one run against a reference table, or against the gas's grand check. */
@Entity('comparison')
@Index('IDX_comparison_run', ['run'])
export class Comparison {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Run, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'run_id' })
  run!: Relation<Run>;

  /** The reference table compared with; null for a grand check. */
  @ManyToOne(() => ReferenceTable, { nullable: true, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'reference_id' })
  reference!: Relation<ReferenceTable> | null;

  @Column('varchar', { length: 16 })
  kind!: 'reference' | 'grand';

  @Column('text', { default: '1' })
  normalization!: string;

  /** JSON text: `[{N, agrees, agreesBelow, firstMismatch}]`. */
  @Column('text')
  verdicts!: string;

  /** JSON: the Z_L a reference table's rows imply beside the run's (null: not computed). */
  @Column('text', { name: 'implied_weights', nullable: true })
  impliedWeights!: string | null;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
