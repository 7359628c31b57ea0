import { eq, sql } from 'drizzle-orm';
import type { Database } from '../db';
import { hashPassword, verifyPassword } from '../services/passwords';
import { memberships, shops, users } from '../../db/schema';
import { DEMO_SHOPS, type DemoShop } from './demo-shop';

/** What the seed did, for its log line. */
export interface SeedReport {
  /** Shops created now. */
  shopsCreated: number;
  /** Users created now. */
  usersCreated: number;
  /** Users whose password was reset to the demo password. */
  passwordsReset: number;
}

/**
 * Seeds the invented demo shops and accounts. Idempotent: existing shops and users are kept,
 * missing ones are added, and demo accounts get the current demo password back.
 */
export async function seedDemo(
  db: Database,
  password: string,
  demo: readonly DemoShop[] = DEMO_SHOPS,
): Promise<SeedReport> {
  const report: SeedReport = { shopsCreated: 0, usersCreated: 0, passwordsReset: 0 };
  const hash = await hashPassword(password);
  await db.transaction(async (tx) => {
    for (const shop of demo) {
      let [row] = await tx.select().from(shops).where(eq(shops.slug, shop.slug));
      if (!row) {
        [row] = await tx.insert(shops).values({ slug: shop.slug, name: shop.name }).returning();
        report.shopsCreated++;
      }
      if (!row) throw new Error(`seed: shop ${shop.slug} could not be created`);
      for (const member of shop.members) {
        const [existing] = await tx
          .select()
          .from(users)
          .where(eq(sql`lower(${users.email})`, member.email));
        if (!existing) {
          const [created] = await tx
            .insert(users)
            .values({ email: member.email, name: member.name, passwordHash: hash })
            .returning();
          if (!created) throw new Error(`seed: user ${member.email} could not be created`);
          await tx
            .insert(memberships)
            .values({ userId: created.id, shopId: row.id, roles: member.roles });
          report.usersCreated++;
        } else if (!(await verifyPassword(password, existing.passwordHash))) {
          await tx.update(users).set({ passwordHash: hash }).where(eq(users.id, existing.id));
          report.passwordsReset++;
        }
      }
    }
  });
  return report;
}
