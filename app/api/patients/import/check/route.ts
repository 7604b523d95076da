import { scopeOf } from "@/lib/auth/guard";
import { readJson, route } from "@/lib/http/route";
import { checkImport } from "@/lib/server/patient-import";
import { importCheckSchema } from "@/lib/validation/patient-import";
import { IMPORT_BODY_LIMIT } from "@/lib/patient-import/limits";

// The preview and dry run of an import: a POST because it carries the file; it writes nothing.
export const POST = route({ roles: ["clinician", "admin"] }, async ({ req, user }) => {
  const body = await readJson(req, importCheckSchema, IMPORT_BODY_LIMIT);
  return checkImport(scopeOf(user), body);
});
