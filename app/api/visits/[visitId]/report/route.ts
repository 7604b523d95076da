import { z } from "zod";
import { loadVisitReport } from "@/db/queries/report";
import { recordAudit } from "@/lib/server/audit";
import { scopeOf } from "@/lib/auth/guard";
import { idParam, readQuery, route } from "@/lib/http/route";
import { renderVisitReport } from "@/lib/report";

const querySchema = z.object({ paper: z.enum(["a4", "letter"], { error: "Paper is a4 or letter." }).default("a4") });

export const GET = route<{ visitId: string }>({ roles: ["clinician", "reviewer"] }, async ({ req, user, params, ip }) => {
  const visitId = idParam(params.visitId);
  const { paper } = readQuery(req, querySchema);
  const data = await loadVisitReport(scopeOf(user), visitId);
  const pdf = await renderVisitReport(data, paper);
  await recordAudit({
    userId: user.id, siteId: data.siteId, patientId: data.patientId, action: "visit.report", entityType: "visit", entityId: visitId, ip,
    detail: { paper, status: data.visit.status },
  });
  const name = `dentate-visit-report-${data.visit.visitDate}.pdf`;
  return new Response(new Uint8Array(pdf), {
    status: 200,
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${name}"`,
      "content-length": String(pdf.byteLength),
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
    },
  });
});
