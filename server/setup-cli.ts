// `npm start` and `npm test` run this: apply migrations, then (unless --no-seed) seed the demo.
import { loadConfig } from './config';
import { openDatabase } from './db';
import { runMigrations } from './migrate';
import { demoPassword } from './seed/demo-shop';
import { seedDemoGarage } from './seed/demo-garage';
import { seedDemo } from './seed/seed';

async function main(): Promise<void> {
  const config = loadConfig();
  const { db, pool } = openDatabase(config.databaseUrl, 2);
  try {
    await runMigrations(db);
    console.log('[cellsmith] migrations applied');
    if (!process.argv.includes('--no-seed')) {
      const report = await seedDemo(db, demoPassword());
      console.log(
        `[cellsmith] demo shop seeded (${report.shopsCreated} shops, ${report.usersCreated} users added, ` +
          `${report.passwordsReset} passwords reset)`,
      );
      if (!process.argv.includes('--no-garage')) {
        const vehiclesAdded = await seedDemoGarage(db, config);
        console.log(`[cellsmith] demo garage: ${vehiclesAdded} vehicles added with their logs`);
      }
    }
  } finally {
    await pool.end();
  }
}

main().catch((err: unknown) => {
  console.error('[cellsmith] database set-up failed:', err);
  process.exit(1);
});
