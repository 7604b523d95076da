import { notFound } from "next/navigation";
import { AppShell } from "@/components/shell/app-shell";
import { CompareView } from "@/components/review/compare-view";
import "@/components/timeline/timeline-print.css";
import { getPatient } from "@/db/queries/patients";
import { listReviewersForSite } from "@/db/queries/reviews";
import { recordAudit } from "@/lib/server/audit";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES, requirePageRole, pageClientIp } from "@/lib/auth/page-guard";
import { uuidParam } from "@/lib/http/route";

export const metadata = { title: "Compare visits" };

const one = (v: string | string[] | undefined) => {
  const s = Array.isArray(v) ? v[0] : v;
  return s && uuidParam.safeParse(s).success ? s : undefined;
};

/** Two visits side by side; the reviewer picker needs the patient's site, read here. */
export default async function ComparePage({ params, searchParams }: { params: Promise<{ patientId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const id = uuidParam.safeParse((await params).patientId);
  if (!id.success) notFound();
  const patient = await getPatient(scopeOf(user), id.data);
  if (!patient) notFound();
  await recordAudit({ userId: user.id, ip: await pageClientIp(), siteId: patient.siteId, patientId: patient.id, action: "patient.read" });
  const reviewers = await listReviewersForSite(patient.siteId);
  const q = await searchParams;
  return (
    <AppShell user={user}>
      <div data-print-root>
        <CompareView
          patientId={patient.id}
          convention={user.displayConvention}
          user={{ id: user.id, role: user.role }}
          reviewers={reviewers}
          initial={{ a: one(q.a), b: one(q.b), track: one(q.track) }}
        />
      </div>
    </AppShell>
  );
}
