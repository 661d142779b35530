import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { Study } from './study.entity.js';
import { User } from './user.entity.js';

/** A low-N table from elsewhere: the file exactly as uploaded and the rows read from it. */
@Entity('reference_table')
@Index('IDX_reference_table_study', ['study'])
export class ReferenceTable {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Study, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'study_id' })
  study!: Relation<Study>;

  @Column('varchar', { length: 200 })
  title!: string;

  /** The uploaded bytes, unchanged; never read with the row (`select: false`). */
  @Column('blob', { name: 'file_bytes', select: false })
  fileBytes!: Buffer;

  /** Length of the uploaded bytes, counted by the quotas. */
  @Column('integer', { name: 'size_bytes', default: 0 })
  sizeBytes!: number;

  /** Rows read from the file (the length of `rows`), for lists. */
  @Column('integer', { name: 'row_count', default: 0 })
  rowCount!: number;

  /** Every value is a decimal number (`isNumericTable`), for lists. */
  @Column('boolean', { default: false })
  numeric!: boolean;

  @Column('varchar', { length: 255 })
  filename!: string;

  @Column('varchar', { name: 'content_type', length: 100 })
  contentType!: string;

  /** Hex SHA-256 of the uploaded bytes. */
  @Column('varchar', { length: 64 })
  sha256!: string;

  /** JSON text: `[{line, N, value, note}]`. */
  @Column('text')
  rows!: string;

  /** Expression in N and the variable multiplying Z(N) before comparison. */
  @Column('text', { default: '1' })
  normalization!: string;

  @Column('varchar', { length: 1, default: 'q' })
  variable!: string;

  @Column('text', { default: '' })
  note!: string;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
