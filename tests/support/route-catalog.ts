// Every route handler under app/api, found on disk at test time so that a route added
// tomorrow is checked by the same tests without anyone remembering to list it.
import { readdirSync, statSync } from "node:fs";
import path from "node:path";

export const HTTP_METHODS = ["GET", "HEAD", "OPTIONS", "POST", "PUT", "PATCH", "DELETE"] as const;
export const MUTATING_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export type Handler = ((req: Request, ctx?: { params?: Promise<Record<string, string>> }) => Promise<Response>) & {
  dentateRoles?: readonly string[] | "any" | "public";
};

export interface RouteEntry {
  /** e.g. "PATCH /api/visits/[visitId]/lesions/[lesionId]" */
  key: string;
  method: string;
  pattern: string;
  file: string;
  params: string[];
  handler: Handler;
}

const ROOT = path.resolve(import.meta.dirname, "../..");

function walk(dir: string, out: string[]) {
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) walk(full, out);
    else if (name === "route.ts" || name === "route.tsx" || name === "route.js") out.push(full);
  }
}

export function routeFiles(): string[] {
  const out: string[] = [];
  walk(path.join(ROOT, "app/api"), out);
  return out.sort();
}

/** Imports every route module and lists each exported HTTP method as one entry. */
export async function loadRoutes(): Promise<RouteEntry[]> {
  const entries: RouteEntry[] = [];
  for (const file of routeFiles()) {
    const rel = path.relative(ROOT, file);
    // Route groups "(name)" do not appear in the URL.
    const pattern = "/" + path.dirname(rel).replace(/^app\//, "").split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/");
    const params = [...pattern.matchAll(/\[(?:\.\.\.)?([^\]]+)\]/g)].map((m) => m[1]!);
    const mod = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
    for (const method of HTTP_METHODS) {
      const handler = mod[method];
      if (typeof handler !== "function") continue;
      entries.push({ key: `${method} ${pattern}`, method, pattern, file: rel, params, handler: handler as Handler });
    }
  }
  return entries;
}

/** encodeURIComponent that survives lone surrogates (which no URL can carry). */
export function safeEncode(v: string): string {
  try {
    return encodeURIComponent(v);
  } catch {
    return "%EF%BF%BD";
  }
}

export function fillPath(pattern: string, params: Record<string, string>): string {
  return pattern.replace(/\[(?:\.\.\.)?([^\]]+)\]/g, (_, name: string) => {
    // A lone surrogate cannot be put in a URL; the handler still receives it through ctx().
    return safeEncode(params[name] ?? "");
  });
}
