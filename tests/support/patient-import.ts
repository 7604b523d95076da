// Calling the import routes as the page does, for the import tests.
import { POST as check } from "@/app/api/patients/import/check/route";
import { POST as run } from "@/app/api/patients/import/route";
import type { ImportEvent, ImportReport } from "@/lib/patient-import/report";
import { req, type Actor } from "../fixtures/factory";

export async function checkFile(who: Actor, body: Record<string, unknown>) {
  const res = await check(req("POST", "/api/patients/import/check", who, body));
  return { status: res.status, body: (await res.json()) as ImportReport & { error?: { message: string; fields?: Record<string, string[]> } } };
}

/** Runs an import; an accepted one answers newline-delimited events, a refused one JSON. */
export async function importFile(who: Actor, body: Record<string, unknown>) {
  const res = await run(req("POST", "/api/patients/import", who, body));
  const text = await res.text();
  if (res.headers.get("content-type")?.includes("ndjson")) {
    const events = text.trim().split("\n").map((l) => JSON.parse(l) as ImportEvent);
    return { status: res.status, events, last: events.at(-1)!, refusal: null };
  }
  return { status: res.status, events: [], last: null, refusal: JSON.parse(text) as { error: { message: string; fields?: Record<string, string[]> }; report?: ImportReport } };
}
