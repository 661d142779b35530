import type { DataSource } from 'typeorm';

/**
 * Makes `dataSource.transaction` run one at a time. better-sqlite3 gives TypeORM a single
 * connection, so two transactions begun concurrently (a request and a background run finishing)
 * would otherwise collide ("cannot start a transaction within a transaction"). Callers must not
 * start a transaction from inside another one (use the `manager` they were given).
 */
export function serializeTransactions(dataSource: DataSource): void {
  const original = dataSource.transaction.bind(dataSource) as (
    ...args: unknown[]
  ) => Promise<unknown>;
  let tail: Promise<unknown> = Promise.resolve();
  dataSource.transaction = ((...args: unknown[]) => {
    const next = tail.then(
      () => original(...args),
      () => original(...args),
    );
    tail = next.catch(() => undefined);
    return next;
  }) as DataSource['transaction'];
}
