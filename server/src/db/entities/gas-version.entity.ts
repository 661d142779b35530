import {
  Column,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  Unique,
  type Relation,
} from 'typeorm';
import { Gas } from './gas.entity.js';
import { User } from './user.entity.js';

/** One immutable version of a gas: the spec JSON exactly as validated when it was saved. */
@Entity('gas_version')
@Unique('UQ_gas_version_number', ['gas', 'version'])
export class GasVersion {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @ManyToOne(() => Gas, (gas) => gas.versions, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'gas_id' })
  gas!: Relation<Gas>;

  @Column('integer')
  version!: number;

  /** The `traceloom.gas/1` JSON text, validated by the shared schema. */
  @Column('text')
  spec!: string;

  @ManyToOne(() => User, { nullable: false, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy!: Relation<User>;

  @Column('varchar', { name: 'created_at', length: 30 })
  createdAt!: string;
}
