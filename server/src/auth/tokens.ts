import jwt from 'jsonwebtoken';
import { keyId } from './token-keys.js';

/** The algorithm tokens are signed with; verification accepts nothing else. */
export const TOKEN_ALGORITHM = 'HS256' as const;

/** Claims Traceloom puts in a token. `role` is informative only: the database decides. */
export interface TokenClaims {
  sub: string;
  tv: number;
  role: string;
}

/**
 * Signs a token for `claims`, valid for `ttlSeconds`, with the key's id in the `kid` header (so
 * verification picks the key after a rotation); returns it with its expiry time.
 */
export function signToken(
  claims: TokenClaims,
  secret: Buffer,
  ttlSeconds: number,
): { token: string; expiresAt: string } {
  const token = jwt.sign(claims, secret, {
    algorithm: TOKEN_ALGORITHM,
    expiresIn: ttlSeconds,
    keyid: keyId(secret),
  });
  const { exp } = jwt.decode(token) as { exp: number };
  return { token, expiresAt: new Date(exp * 1000).toISOString() };
}
