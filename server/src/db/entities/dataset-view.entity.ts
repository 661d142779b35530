import { Column, Entity, JoinColumn, OneToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Dataset } from './dataset.entity.js';

/**
 * What the dataset page and the lock checks read of a dataset's snapshot, kept beside it when
 * the dataset is made (in a worker): the summary (gas, run, N_max, order, Z(N) rows, the
 * sentence of what is known) and the check rows before waivers. The snapshot itself, which may
 * be tens of megabytes, is then parsed only by verify and exports, off the main thread.
 */
@Entity('dataset_view')
export class DatasetView {
  @PrimaryColumn('varchar', { name: 'dataset_id' })
  datasetId!: string;

  /** JSON: the `snapshot` part of the dataset answer. */
  @Column('text')
  summary!: string;

  /** JSON: the check rows with `agrees`, before waivers. */
  @Column('text')
  checks!: string;

  @OneToOne(() => Dataset, { nullable: false, onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset!: Relation<Dataset>;
}
