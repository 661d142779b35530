import type { RequestHandler } from 'express';
import jwt from 'jsonwebtoken';
import passport from 'passport';
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import type { AppContext } from '../app-context.js';
import { User } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { keyId } from './token-keys.js';
import { TOKEN_ALGORITHM, type TokenClaims } from './tokens.js';

function unauthenticated(): AppError {
  return new AppError(
    401,
    'unauthenticated',
    'Sign in to continue: the token is missing or no longer valid.',
  );
}

/** Seconds a token's `iat` may lie in the future (clocks of one machine; common practice). */
const CLOCK_SKEW_SECONDS = 60;

/**
 * True when the claims carry a numeric `exp` and `iat`, the token lives at most `maxAge` seconds
 * and was not issued in the future: a token without `exp`, or one minted for a year, is refused
 * even when its signature is right.
 */
export function lifetimeOk(claims: { exp?: unknown; iat?: unknown }, maxAge: number): boolean {
  const { exp, iat } = claims;
  if (typeof exp !== 'number' || typeof iat !== 'number') return false;
  const now = Date.now() / 1000;
  return exp - iat <= maxAge && iat <= now + CLOCK_SKEW_SECONDS && now - iat <= maxAge;
}

/**
 * Builds the bearer-token check: passport-jwt with HS256 pinned and the key chosen by `kid`,
 * `exp` and a maximum age required, then the database. A token only
 * counts while its user exists, is not disabled and still has the token version (`tv`) it was
 * signed with — so logout, a role change and disabling revoke every earlier token. Sets
 * `res.locals.actor` from the database row (never from the token's claims) and `res.locals.token`
 * ({tv, exp}), or answers 401.
 */
export function createAuthenticate(ctx: AppContext): RequestHandler {
  const authenticator = new passport.Passport();
  authenticator.use(
    new JwtStrategy(
      {
        // The Authorization header only: a token never travels in a URL (logs, history).
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        // The key named by the token's `kid`: the current one or one kept since a rotation.
        secretOrKeyProvider: (_req, rawToken: string, done) => {
          const kid = jwt.decode(rawToken, { complete: true })?.header.kid;
          const key = ctx.tokenKeys.all.find((k) => keyId(k) === kid);
          if (key) done(null, key);
          else done(new Error('unknown signing key'));
        },
        algorithms: [TOKEN_ALGORITHM],
        ignoreExpiration: false,
      },
      (
        claims: Partial<TokenClaims> & { exp?: unknown; iat?: unknown },
        done: (err: unknown, user?: Actor | false, info?: unknown) => void,
      ) => {
        if (typeof claims.sub !== 'string' || typeof claims.tv !== 'number')
          return done(null, false);
        if (!lifetimeOk(claims, ctx.config.tokenTtlSeconds)) return done(null, false);
        ctx.dataSource
          .getRepository(User)
          .findOneBy({ id: claims.sub })
          .then((user) => {
            if (!user || user.disabled || user.tokenVersion !== claims.tv) return done(null, false);
            const { id, email, displayName, role } = user;
            done(null, { id, email, displayName, role }, { tv: claims.tv, exp: claims.exp });
          }, done);
      },
    ),
  );
  return (req, res, next) => {
    authenticator.authenticate(
      'jwt',
      { session: false },
      (err: unknown, actor: Actor | false, token: unknown) => {
        if (err) return next(err);
        if (!actor) return next(unauthenticated());
        res.locals.actor = actor;
        // Version and expiry of the token, for what outlives the request (progress streams).
        res.locals.token = token;
        next();
      },
    )(req, res, next);
  };
}
