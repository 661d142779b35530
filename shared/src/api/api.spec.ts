import { describe, expect, it } from 'vitest';
import {
  inviteSchema,
  loginSchema,
  memberAddSchema,
  studyCreateSchema,
  studyPatchSchema,
  userPatchSchema,
} from './index.js';

// Limits are the API contract's (title 1..200 trimmed, description <= 5000, e-mail <= 254,
// display name 1..100, password <= 1024).
describe('API request schemas', () => {
  it('trims and lower-cases e-mail addresses', () => {
    expect(loginSchema.parse({ email: '  Ada@Example.TEST ', password: 'x' }).email).toBe(
      'ada@example.test',
    );
  });

  it.each([
    [loginSchema, { email: 'a@b.test', password: '' }, 'password'],
    [loginSchema, { email: 'a@b.test', password: 'p'.repeat(1025) }, 'password'],
    [loginSchema, { email: 'nope', password: 'x' }, 'email'],
    [
      inviteSchema,
      { email: 'a@b.test', displayName: 'n'.repeat(101), role: 'author' },
      'displayName',
    ],
    [inviteSchema, { email: 'a@b.test', displayName: 'N', role: 'root' }, 'role'],
    [studyCreateSchema, { title: ' ' }, 'title'],
    [studyCreateSchema, { title: 't'.repeat(201) }, 'title'],
    [studyCreateSchema, { title: 't', description: 'd'.repeat(5001) }, 'description'],
    [memberAddSchema, { userId: '42' }, 'userId'],
    [userPatchSchema, { disabled: 'yes' }, 'disabled'],
  ] as const)('refuses %#: names %s', (schema, input, field) => {
    const result = schema.safeParse(input);
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path.join('.')).toBe(field);
  });

  it('accepts values at the limits', () => {
    expect(
      studyCreateSchema.parse({ title: 't'.repeat(200), description: 'd'.repeat(5000) }).title,
    ).toHaveLength(200);
    expect(loginSchema.safeParse({ email: 'a@b.test', password: 'p'.repeat(1024) }).success).toBe(
      true,
    );
    expect(
      inviteSchema.safeParse({ email: 'a@b.test', displayName: 'n'.repeat(100), role: 'steward' })
        .success,
    ).toBe(true);
  });

  it('refuses unknown fields and empty patches', () => {
    expect(studyCreateSchema.safeParse({ title: 't', owner: 'me' }).success).toBe(false);
    expect(studyPatchSchema.safeParse({}).success).toBe(false);
    expect(userPatchSchema.safeParse({}).success).toBe(false);
    expect(userPatchSchema.parse({ role: 'admin' })).toEqual({ role: 'admin' });
  });
});
