import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { shops, users } from '../../../db/schema';
import { seedDemo } from '../../../server/seed/seed';
import type { Role } from '../../../shared/contracts/roles';
import type { Database } from '../../../server/db';

/** The password of every account a test shop gets. */
export const TEST_PASSWORD = 'test-password-123';

/** A shop made for one test file, so tests that change members never touch the demo shop. */
export interface TestShop {
  /** The shop's id. */
  id: string;
  /** The shop's name. */
  name: string;
  /** E-mail of each member, by role name. */
  emails: Record<'admin' | 'tuner' | 'operator' | 'reviewer', string>;
  /** User id by e-mail. */
  userIds: Record<string, string>;
}

/** Creates a shop with one admin, tuner, operator and reviewer, all with unique e-mails. */
export async function createTestShop(db: Database, label: string): Promise<TestShop> {
  const tag = `${label}-${randomBytes(4).toString('hex')}`;
  const roles: Role[] = ['admin', 'tuner', 'operator', 'reviewer'];
  const emails = Object.fromEntries(
    roles.map((role) => [role, `${role}.${tag}@shop.test`]),
  ) as TestShop['emails'];
  const name = `Test shop ${tag}`;
  await seedDemo(db, TEST_PASSWORD, [
    {
      slug: tag,
      name,
      members: roles.map((role) => ({
        email: emails[role],
        name: `${role} of ${tag}`,
        roles: [role],
      })),
    },
  ]);
  const [shop] = await db.select().from(shops).where(eq(shops.slug, tag));
  if (!shop) throw new Error('createTestShop: shop missing');
  const userIds: Record<string, string> = {};
  for (const email of Object.values(emails)) {
    const [user] = await db.select().from(users).where(eq(users.email, email));
    if (!user) throw new Error(`createTestShop: ${email} missing`);
    userIds[email] = user.id;
  }
  return { id: shop.id, name, emails, userIds };
}
