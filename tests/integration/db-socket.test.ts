// How the app's pool reaches PostgreSQL. With DATABASE_SOCKET_DIR (scripts/start.sh, test.sh and
// bench.sh set it: the database runs on the same machine), through the server's Unix socket;
// without it, by TCP to the host in DATABASE_URL. pg_stat_activity.client_addr is null for a
// Unix-socket connection and the client's IP address for TCP (PostgreSQL manual, "The Cumulative
// Statistics System", pg_stat_activity).
import { describe, expect, it } from "vitest";
import { sql } from "@/db/client";

describe("the database connection", () => {
  it("goes through the Unix socket exactly when DATABASE_SOCKET_DIR is set", async () => {
    const [me] = await sql<{ addr: string | null }[]>`select client_addr::text as addr from pg_stat_activity where pid = pg_backend_pid()`;
    if (process.env.DATABASE_SOCKET_DIR) expect(me!.addr).toBeNull();
    else expect(me!.addr).toMatch(/^(127\.0\.0\.1|::1)/);
  });
});
