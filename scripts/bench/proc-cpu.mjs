// CPU time used by the server process and by PostgreSQL (the postmaster and its children: the
// pool's backends stay connected through a pass), read from /proc/<pid>/stat, fields 14 and 15
// (utime, stime, in clock ticks; proc(5)). Linux only; a bench row divides the difference by the
// requests answered.
import { readdirSync, readFileSync } from "node:fs";
import { execFileSync } from "node:child_process";

const TICK_MS = 1000 / Number(execFileSync("getconf", ["CLK_TCK"], { encoding: "utf8" }).trim() || 100);

/** [ppid, utime + stime in ticks] of one process, or null when it is gone. */
function stat(pid) {
  try {
    const text = readFileSync(`/proc/${pid}/stat`, "utf8");
    // The command name (field 2) is in parentheses and may hold spaces: fields count after it.
    const rest = text.slice(text.lastIndexOf(")") + 2).split(" ");
    return [Number(rest[1]), Number(rest[11]) + Number(rest[12])];
  } catch {
    return null;
  }
}

/** CPU so far: the server process in ms, and PostgreSQL's processes in ticks by pid. */
export function cpuNow(serverPid, postmasterPid) {
  const server = stat(serverPid)?.[1] ?? NaN;
  const pg = new Map();
  if (postmasterPid) {
    for (const name of readdirSync("/proc")) {
      if (!/^\d+$/.test(name)) continue;
      const s = stat(name);
      if (s && (Number(name) === postmasterPid || s[0] === postmasterPid)) pg.set(name, s[1]);
    }
  }
  return { serverMs: server * TICK_MS, pg };
}

/** Per answered request: server and PostgreSQL CPU ms between two readings (processes new since `a` count from 0). */
export function cpuPerRequest(a, b, answered) {
  let pgTicks = 0;
  for (const [pid, ticks] of b.pg) pgTicks += ticks - (a.pg.get(pid) ?? 0);
  const server = b.serverMs - a.serverMs;
  const pg = pgTicks * TICK_MS;
  const per = (x) => (answered > 0 ? +(x / answered).toFixed(2) : null);
  return { serverMs: per(server), postgresMs: per(pg), totalMs: per(server + pg), answered };
}
