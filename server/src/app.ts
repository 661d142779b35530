import express, { type Express } from 'express';
import type { DataSource } from 'typeorm';
import type { AppContext } from './app-context.js';
import { createServices, type AppServices } from './app-services.js';
import { createAuthenticate } from './auth/authenticate.js';
import { AccountBackoff, HashGate, signInLimiters } from './auth/sign-in-guards.js';
import { hashPassword } from './auth/password.js';
import { forgetDatabaseSecret, keysFromFile } from './auth/token-keys.js';
import type { ServerConfig } from './config.js';
import { jsonDepthGuard, methodNotAllowed, noStore } from './http/api-guards.js';
import { apiNotFound, errorMiddleware, notFound } from './http/error-middleware.js';
import { buildRouter } from './http/route-table.js';
import { securityHeaders } from './http/security-headers.js';
import { staticClient } from './http/static-client.js';
import { apiRoutes } from './routes.js';

/** What `createApp` needs: an initialized, migrated data source and the configuration. */
export interface AppDeps {
  dataSource: DataSource;
  config: ServerConfig;
  /** Where unexpected errors are logged (default: console.error). */
  log?: (err: unknown) => void;
}

/** A built app: the Express handler, its services, and the one way to stop them. */
export interface TraceloomApp {
  app: Express;
  services: AppServices;
  /**
   * Stops what the app started (event streams, run queue, worker threads, mail fake); running
   * runs stay `running` for the next start's recovery. The data source stays open: its owner
   * destroys it after.
   */
  close(): Promise<void>;
}

/**
 * Builds the Express app (without listening): security headers, JSON body limit, the API from
 * the route table, a JSON 404 for unknown /api paths, the built client when present, and the
 * one error middleware. Takes the signing keys from the configuration or the key file (created on
 * first start) and removes any secret an older server kept in the database. Builds the app's
 * services once (`createServices`); the answer's `close()` stops them.
 */
export async function createApp({ dataSource, config, log }: AppDeps): Promise<TraceloomApp> {
  const tokenKeys = config.tokenKeys ?? keysFromFile(config.keyFile);
  await forgetDatabaseSecret(dataSource);
  const services = createServices(dataSource, config, log);
  const ctx: AppContext = {
    dataSource,
    config,
    services,
    tokenSecret: tokenKeys.current,
    tokenKeys,
    accountBackoff: new AccountBackoff(dataSource, config.signIn),
    hashGate: new HashGate(config.signIn.hashConcurrency, config.signIn.hashQueue),
    decoyPasswordHash: await hashPassword('decoy password, never matched', config.scrypt),
  };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);
  // No ETag: it would hash every (possibly large) answer on the main thread.
  app.set('etag', false);
  app.use(securityHeaders());
  app.use('/api', noStore, express.json({ limit: config.bodyLimitBytes }), jsonDepthGuard);
  const limiters = signInLimiters(dataSource, config.signIn);
  for (const path of ['/api/auth/login', '/api/auth/password-reset']) app.post(path, ...limiters);
  const routes = apiRoutes(ctx);
  // Kept on the app so tests read the very table the router was built from.
  app.locals.routeTable = routes.map(({ method, path, access }) => ({ method, path, access }));
  app.use('/api', buildRouter(routes, createAuthenticate(ctx)));
  app.use('/api', methodNotAllowed(routes), apiNotFound);
  if (config.staticDir) app.use(staticClient(config.staticDir));
  app.use(notFound);
  app.use(errorMiddleware(log));
  return { app, services, close: () => services.close() };
}
