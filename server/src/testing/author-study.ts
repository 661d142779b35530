import type { User } from '../db/entities/index.js';
import { createTestApp, insertStudy, insertUser, tokenFor, type TestApp } from './test-app.js';

/** A test app with one author, their token and a study they own: the usual start of a spec. */
export interface AuthorStudy {
  t: TestApp;
  author: User;
  token: string;
  studyId: string;
}

/** Builds an `AuthorStudy` (a fresh temporary database); close it with `t.close()`. */
export async function authorStudy(
  options?: Parameters<typeof createTestApp>[0],
): Promise<AuthorStudy> {
  const t = await createTestApp(options);
  const author = await insertUser(t, 'author');
  return { t, author, token: await tokenFor(t, author), studyId: await insertStudy(t, author) };
}
