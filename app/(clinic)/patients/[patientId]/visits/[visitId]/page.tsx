import Link from "next/link";
import { notFound } from "next/navigation";
import { AppShell } from "@/components/shell/app-shell";
import { VisitMapEditor } from "@/components/visit/map-editor/visit-map-editor";
import { LazyVisitGallery, LazyVisitRecordPanels } from "@/components/visit/lazy-panels";
import { BiopsiesPanel } from "@/components/visit/biopsies-panel";
import { VisitNumbering } from "@/components/visit/numbering";
import { DiscardVisit } from "@/components/visit/discard-visit";
import { getPatient } from "@/db/queries/patients";
import { listLesionsForVisit } from "@/db/queries/lesions";
import { scopeOf } from "@/lib/auth/guard";
import { CLINICAL_ROLES, pageClientIp, requirePageRole } from "@/lib/auth/page-guard";
import { AppError } from "@/lib/errors";
import { uuidParam } from "@/lib/http/route";

export const metadata = { title: "Visit" };

export default async function VisitPage({ params }: { params: Promise<{ patientId: string; visitId: string }> }) {
  const user = await requirePageRole(CLINICAL_ROLES);
  const p = await params;
  const patientId = uuidParam.safeParse(p.patientId);
  const visitId = uuidParam.safeParse(p.visitId);
  if (!patientId.success || !visitId.success) notFound();
  const scope = scopeOf(user);
  const patient = await getPatient(scope, patientId.data);
  if (!patient) notFound();
  // The visit with its map, drawn in the first paint; the read is audited by the reading statement.
  // Narrowed to the URL's patient, so a visit of another patient answers 404 before any read is recorded.
  const map = await listLesionsForVisit(scope, visitId.data, { userId: user.id, action: "visit.read", entityType: "visit", ip: await pageClientIp() }, patient.id).catch((e) =>
    e instanceof AppError ? null : Promise.reject(e),
  );
  if (!map || map.visit.patientId !== patient.id) notFound();
  const { visit } = map;
  const canEdit = user.role === "clinician" && visit.status === "draft";
  return (
    <AppShell user={user}>
      <nav aria-label="Breadcrumb" className="no-print text-sm">
        <Link href="/patients" className="text-lagoon-700 underline">Patients</Link> /{" "}
        <Link href={`/patients/${patient.id}`} className="text-lagoon-700 underline">{patient.familyName}, {patient.givenName}</Link> /
      </nav>
      <div className="mt-1 flex flex-wrap items-baseline gap-x-4">
        <h1 className="text-2xl font-bold">Visit of {visit.visitDate}</h1>
        <span className="text-ink-soft">{patient.familyName}, {patient.givenName} · MRN {patient.mrn}</span>
        <span className={`rounded-full border px-3 py-0.5 text-sm font-semibold ${visit.status === "signed" ? "border-ink text-ink" : "border-dashed border-ink-soft text-ink-soft"}`}>
          {visit.status === "signed" ? "Signed" : "Draft"}
        </span>
      </div>
      {/* One clock numbering for the whole page, opening in the position of the examination. */}
      <VisitNumbering position={visit.patientPosition}>
        <section aria-labelledby="map-heading" className="mt-4">
          <h2 id="map-heading" className="sr-only">Canal map and visit record</h2>
          <VisitMapEditor
            visitId={visit.id}
            initialConvention={visit.patientPosition}
            canEdit={canEdit}
            initialMap={map}
            sections={[
              { id: "biopsies", label: "Biopsies", content: <BiopsiesPanel visitId={visit.id} canEdit={canEdit} canEnterResults={user.role === "clinician"} /> },
              { id: "procedure", label: "Procedure", content: <LazyVisitRecordPanels visitId={visit.id} part="procedure" /> },
              { id: "record", label: "Record & sign", content: <LazyVisitRecordPanels visitId={visit.id} part="record" /> },
            ]}
          />
        </section>
        <section aria-label="Photographs and documents" className="mt-8">
          <LazyVisitGallery visitId={visit.id} canUpload={canEdit} convention={visit.patientPosition} />
        </section>
      </VisitNumbering>
      {visit.status === "draft" && (user.role === "clinician" || user.role === "admin") ? (
        <div className="no-print mt-8">
          <DiscardVisit visitId={visit.id} patientId={patient.id} />
        </div>
      ) : null}
    </AppShell>
  );
}
