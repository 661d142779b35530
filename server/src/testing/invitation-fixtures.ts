import type { User } from '../db/entities/index.js';
import { api } from './dataset-fixtures.js';
import type { TestApp } from './test-app.js';

/** Invites `email` and returns the key the invitation mail carries. */
export async function invitationKey(app: TestApp, by: User, email: string): Promise<string> {
  await api(app, by, 'post', '/users', { email, displayName: 'Lena Brask', role: 'author' }, 201);
  const box: Array<{ envelope: { to: string[] }; text: string }> = await api(
    app,
    by,
    'get',
    '/dev/mailbox',
    undefined,
    200,
  );
  const mail = box.find((m) => m.envelope.to.includes(email));
  const key = /\/welcome\/([0-9a-f-]{36}\.\d{13}\.[A-Za-z0-9_-]{43})/.exec(mail?.text ?? '')?.[1];
  if (!key) throw new Error(`no invitation key in the mail to ${email}`);
  return key;
}
