import type { Role } from '@traceloom/shared/api';
import type { DataSource } from 'typeorm';
import { hashPassword } from '../auth/password.js';
import type { ScryptParams } from '../config.js';
import { AuditEvent, Study, StudyMember, User } from './entities/index.js';
import { seedDemoGases } from './seed-demo-gases.js';

/** The shared demo password, printed at start in demo mode. */
export const DEMO_PASSWORD = 'traceloom-demo';

/** Demo accounts: invented people, one per role. */
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; displayName: string; role: Role }> = [
  { email: 'author@demo.test', displayName: 'Ilse Marenko', role: 'author' },
  { email: 'reviewer@demo.test', displayName: 'Tomas Quellby', role: 'reviewer' },
  { email: 'steward@demo.test', displayName: 'Odile Brandvik', role: 'steward' },
  { email: 'admin@demo.test', displayName: 'Ravi Teodor', role: 'admin' },
];

const DEMO_STUDY = {
  title: 'Fermions on a ring',
  description:
    'A small working group comparing free fermions on a ring under a few invented kernels — ' +
    'c_p = q^|p| and a two-parameter family deforming it — against the harmonic trap, whose ' +
    'closed form serves as the check that the machinery is right.',
};

/**
 * Seeds the demo accounts and the demo study "Fermions on a ring" (owned by the author, with
 * the reviewer and steward as members). Idempotent: existing accounts and the study are kept
 * as they are. Only called in demo mode.
 */
export async function seedDemo(dataSource: DataSource, scrypt: ScryptParams): Promise<void> {
  const users = dataSource.getRepository(User);
  const byRole = new Map<Role, User>();
  const missing: Array<(typeof DEMO_ACCOUNTS)[number]> = [];
  for (const account of DEMO_ACCOUNTS) {
    const user = await users.findOneBy({ email: account.email });
    if (user) byRole.set(account.role, user);
    else missing.push(account);
  }
  // Each account gets its own salt; hashing them side by side uses both of libuv's spare cores.
  const hashes = await Promise.all(missing.map(() => hashPassword(DEMO_PASSWORD, scrypt)));
  for (const [i, account] of missing.entries()) {
    const user = await users.save(
      users.create({
        ...account,
        passwordHash: hashes[i],
        tokenVersion: 0,
        disabled: false,
        createdAt: new Date().toISOString(),
      }),
    );
    byRole.set(account.role, user);
  }
  const author = byRole.get('author')!;
  const studies = dataSource.getRepository(Study);
  const existing = await studies.findOneBy({ title: DEMO_STUDY.title, owner: { id: author.id } });
  if (existing) {
    await seedDemoGases(dataSource, existing.id, author, byRole.get('reviewer')!);
    return;
  }
  const studyId = await dataSource.transaction(async (manager) => {
    const now = new Date().toISOString();
    const study = await manager
      .getRepository(Study)
      .save({ ...DEMO_STUDY, owner: { id: author.id }, createdAt: now, updatedAt: now });
    for (const role of ['reviewer', 'steward'] as const) {
      await manager
        .getRepository(StudyMember)
        .insert({ study: { id: study.id }, user: { id: byRole.get(role)!.id }, addedAt: now });
    }
    await manager.getRepository(AuditEvent).insert({
      actor: { id: author.id },
      action: 'study.create',
      targetType: 'study',
      targetId: study.id,
      detail: JSON.stringify({ title: DEMO_STUDY.title, seeded: true }),
      createdAt: now,
    });
    return study.id;
  });
  await seedDemoGases(dataSource, studyId, author, byRole.get('reviewer')!);
}
