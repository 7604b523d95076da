// Applies the committed drizzle-kit migrations. Run by scripts/start.sh and scripts/test.sh.
import { drizzle } from "drizzle-orm/postgres-js";
import { migrate } from "drizzle-orm/postgres-js/migrator";
import postgres from "postgres";
import path from "node:path";

const url = process.env.DATABASE_URL;
if (!url) throw new Error("DATABASE_URL is not set");
const sql = postgres(url, { max: 1, onnotice: () => {} });
await migrate(drizzle(sql), { migrationsFolder: path.join(import.meta.dirname, "migrations") });
await sql.end();
console.log("migrations applied");
