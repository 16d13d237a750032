/** Applies the committed migrations; logs and exits non-zero on failure. */
import { migrate } from "drizzle-orm/postgres-js/migrator";
import { fileURLToPath } from "node:url";
import { createPool, databaseUrl } from "./client";
import { installQueue } from "../workers/server/boss";

export async function runMigrations(url: string): Promise<void> {
  const pool = createPool(url, 1);
  try {
    await migrate(pool.db, { migrationsFolder: fileURLToPath(new URL("./migrations", import.meta.url)) });
    const [role] = await pool.sql`SELECT current_user AS name, rolsuper AS superuser FROM pg_roles WHERE rolname = current_user`;
    if (role?.superuser) {
      console.warn(`[pourline] warning: the database role "${role.name}" is a superuser. Connect the app as a role that owns its schema and nothing more (README, "Deploying safely").`);
    }
  } finally {
    await pool.sql.end({ timeout: 5 });
  }
  // The engine job queue's own tables (pg-boss), created by the same owner as ours.
  await installQueue(url);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const started = Date.now();
  runMigrations(databaseUrl())
    .then(() => console.log(`[pourline] migrations applied in ${Date.now() - started} ms`))
    .catch((e) => {
      console.error(`[pourline] migration failed: ${e instanceof Error ? e.message : e}`);
      process.exit(1);
    });
}
