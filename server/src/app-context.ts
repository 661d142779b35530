import type { DataSource } from 'typeorm';
import type { LoginThrottle } from './auth/login-throttle.js';
import type { ServerConfig } from './config.js';

/** What route modules and domain functions share: built once per app by `createApp`. */
export interface AppContext {
  dataSource: DataSource;
  config: ServerConfig;
  /** HS256 signing secret (256 bits), loaded from the database. */
  tokenSecret: Buffer;
  loginThrottle: LoginThrottle;
  /** A hash checked against when the e-mail is unknown, so timing does not reveal accounts. */
  decoyPasswordHash: string;
}
