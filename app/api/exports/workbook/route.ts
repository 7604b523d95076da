import { Readable } from "node:stream";
import { streamWorkbookExport } from "@/lib/server/exports";
import { route, type RouteArgs } from "@/lib/http/route";
import { EXPORT_ROLES, attachmentHeaders, exportStamp, prepareExport } from "../prepare";

export const dynamic = "force-dynamic";

const XLSX = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet";

/** GET /api/exports/workbook?studyId=…: counts, lesions and outcomes as one streamed workbook. */
const exportWorkbook = async ({ req, user, ip }: RouteArgs<Record<string, never>>) => {
  const { scope, studyCode } = await prepareExport(req, user);
  const stream = streamWorkbookExport(scope, { userId: user.id, ip, format: "xlsx", reason: scope.filter.reason });
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    headers: attachmentHeaders(`${studyCode}-registry-${exportStamp(scope.filter.identified)}.xlsx`, XLSX),
  });
};

/** De-identified exports are links (GET); an identified one is refused there (403). */
export const GET = route({ roles: EXPORT_ROLES }, exportWorkbook);
/** The export form's POST (Origin checked): the only way to an identified export, admins only. */
export const POST = route({ roles: ["admin"] }, exportWorkbook);
