import { notFound } from "next/navigation";
import { AppShell } from "@/components/shell/app-shell";
import { TimelineView } from "@/components/timeline/timeline-view";
import "@/components/timeline/timeline-print.css";
import { CLINICAL_ROLES, requirePageRole } from "@/lib/auth/page-guard";
import { uuidParam } from "@/lib/http/route";

export const metadata = { title: "Timeline" };

/** The data (and its audit entry) come from the timeline route through SWR. */
export default async function TimelinePage({ params }: { params: Promise<{ patientId: string }> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const id = uuidParam.safeParse((await params).patientId);
  if (!id.success) notFound();
  const todayIso = new Date().toISOString().slice(0, 10);
  return (
    <AppShell user={user}>
      <div data-print-root>
        <TimelineView patientId={id.data} convention={user.displayConvention} todayIso={todayIso} />
      </div>
    </AppShell>
  );
}
