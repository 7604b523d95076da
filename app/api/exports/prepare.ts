import "server-only";
import { getStudy } from "@/db/queries/research/studies";
import type { ExportScope } from "@/db/queries/research/export-scope";
import { scopeOf, type CurrentUser } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { parseWith, readQuery } from "@/lib/http/route";
import { exportFilterSchema } from "@/lib/validation/research";

export const EXPORT_ROLES = ["research_nurse", "admin"] as const;

/**
 * Parses and checks an export request: a study the caller can see (else 404), a site within the
 * caller's scope (else 404), and an identified export only for an admin with a reason (else 403/400).
 */
export async function prepareExport(req: Request, user: CurrentUser): Promise<{ scope: ExportScope; studyCode: string }> {
  const filter = req.method === "POST" ? parseWith(exportFilterSchema, await readBodyFields(req)) : readQuery(req, exportFilterSchema);
  if (filter.identified && user.role !== "admin") throw new AppError("forbidden", "Only an administrator may export identified data.");
  // A link (GET) can be planted on any page and followed with the administrator's cookie: an
  // identified export is only ever started by the export form's POST, which the Origin check guards.
  if (filter.identified && req.method !== "POST") throw new AppError("forbidden", "An identified export is started from the export form, with the reason typed there.");
  const study = await getStudy(scopeOf(user), filter.studyId);
  if (!study) throw new AppError("not_found");
  if (filter.siteId && !study.sites.some((s) => s.id === filter.siteId)) throw new AppError("not_found");
  return { scope: { filter, siteIds: study.sites.map((s) => s.id) }, studyCode: study.code };
}

export function attachmentHeaders(filename: string, contentType: string): HeadersInit {
  return {
    "content-type": contentType,
    "content-disposition": `attachment; filename="${filename.replace(/[^A-Za-z0-9._-]/g, "_")}"`,
    "cache-control": "no-store",
    "x-content-type-options": "nosniff",
  };
}

export function exportStamp(identified: boolean): string {
  return `${new Date().toISOString().slice(0, 10)}${identified ? "-IDENTIFIED" : ""}`;
}

/** The fields of a POSTed export request: the export form's fields, or the same as JSON. */
async function readBodyFields(req: Request): Promise<Record<string, unknown>> {
  const type = req.headers.get("content-type") ?? "";
  if (type.includes("application/json")) {
    try {
      const v = (await req.json()) as unknown;
      return v && typeof v === "object" ? (v as Record<string, unknown>) : {};
    } catch {
      throw new AppError("invalid", "The request body is not valid JSON.");
    }
  }
  if (!type.includes("application/x-www-form-urlencoded") && !type.includes("multipart/form-data")) return {};
  const form = await req.formData().catch(() => null);
  if (!form) throw new AppError("invalid", "The form could not be read.");
  return Object.fromEntries([...form.entries()].filter(([, v]) => typeof v === "string"));
}
