/**
 * Run before `next dev` / `next start`: applies migrations and, on first start,
 * seeds the demo data. Safe to run every time. With --production (npm start) it
 * first checks the environment as `next start` will see it, so a missing
 * NEXTAUTH_SECRET stops the start with a clear message instead of failing requests.
 */
import { closeDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { seedDemo } from "@/db/seed";
import { getEnv } from "@/lib/env";

try {
  const env = getEnv(process.argv.includes("--production") ? { ...process.env, NODE_ENV: "production" } : process.env);
  await migrateDatabase();
  const seeded = await seedDemo();
  console.log(`Database ready (${env.databaseUrl})${seeded ? "; demo data created — sign in as admin@brookmere.test / stokeline-demo" : ""}.`);
} catch (err) {
  console.error(`Could not prepare the database: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  closeDb();
}
