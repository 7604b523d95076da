import type postgres from "postgres";

/**
 * Drops a database a test made. Autovacuum (a superuser process a test role may not signal) can
 * be analysing a fresh database for a moment: retry briefly rather than fail the suite on cleanup.
 */
export async function dropTestDatabase(admin: postgres.Sql, name: string): Promise<void> {
  for (let attempt = 0; attempt < 20; attempt++) {
    try {
      await admin.unsafe(`drop database if exists "${name}" with (force)`);
      return;
    } catch (err) {
      if (attempt === 19) console.warn(`could not drop ${name}:`, (err as Error).message);
      await new Promise((r) => setTimeout(r, 500));
    }
  }
}
