import type { DataSource } from 'typeorm';
import type { AppServices } from './app-services.js';
import type { AccountBackoff, HashGate } from './auth/sign-in-guards.js';
import type { TokenKeys } from './auth/token-keys.js';
import type { ServerConfig } from './config.js';

/** What route modules and domain functions share: built once per app by `createApp`. */
export interface AppContext {
  dataSource: DataSource;
  config: ServerConfig;
  /** Worker pools, task runner, run executor, event streams, mailer: built and closed once. */
  services: AppServices;
  /** HS256 signing secret (256 bits): the current key of `tokenKeys`. */
  tokenSecret: Buffer;
  /** Every key that still verifies (the current one first), from the environment or key file. */
  tokenKeys: TokenKeys;
  /** Per-account backoff after failed sign-ins (in the database). */
  accountBackoff: AccountBackoff;
  /** The cap on password hashes computed at once. */
  hashGate: HashGate;
  /** A hash checked against when the e-mail is unknown, so timing does not reveal accounts. */
  decoyPasswordHash: string;
}
