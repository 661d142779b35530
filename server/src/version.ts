import { readFileSync } from 'node:fs';

// This file sits two levels below the repository root both as source (server/src) and compiled
// (dist/server), so the same relative URL finds package.json in both.
const packageJson = JSON.parse(
  readFileSync(new URL('../../package.json', import.meta.url), 'utf8'),
) as { version: string };

/** The product version, from the root package.json. */
export const VERSION: string = packageJson.version;
