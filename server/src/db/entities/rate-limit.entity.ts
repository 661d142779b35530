import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * One rate-limit counter (sign-in buckets and account backoff): hits within a window ending at
 * `resetAt`, and when the last hit came. Kept in the database so a restart forgets nothing.
 */
@Entity('rate_limit')
export class RateLimit {
  @PrimaryColumn('varchar', { length: 300 })
  key!: string;

  @Column('integer')
  hits!: number;

  /** Epoch milliseconds at which the window ends and the count starts again. */
  @Column('integer', { name: 'reset_at' })
  resetAt!: number;

  /** Epoch milliseconds of the last hit. */
  @Column('integer', { name: 'updated_at' })
  updatedAt!: number;
}
