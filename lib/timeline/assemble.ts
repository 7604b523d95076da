// The timeline and compare screens' view of one patient, worked out from the rows the timeline
// statement reads: each lesion's worst histology and effective grade (histology decides), and per
// visit the lesion counts by grade and the treated share of the circumference.
import { type Grade, type Histology, type Modality, type Position, type TrackCheckOutcome, type TrackStatus, type Verdict, type VisitStatus, type Zone } from "@/lib/domain/vocab";
import { unionLengthH } from "@/lib/geometry/arcs";
import { lesionGrades } from "@/lib/tracking/effective-grade";

export interface TimelineRows {
  patient: { id: string; siteId: string; familyName: string; givenName: string; mrn: string };
  visits: { id: string; visitDate: string; status: VisitStatus; patientPosition: Position; examiner: string; examinerId: string }[];
  tracks: { id: string; label: string }[];
  lesions: {
    id: string; visitId: string; trackId: string | null; label: string; clockStartH: number; clockEndH: number;
    distanceStartCm: number; distanceEndCm: number; zone: Zone; grade: Grade; version: number;
  }[];
  biopsies: { lesionId: string | null; label: string; histology: Histology | null }[];
  treatments: { visitId: string; lesionId: string | null; arcs: { startH: number; endH: number }[]; modality: Modality }[];
  statuses: { trackId: string; visitId: string; status: TrackStatus; effectiveGrade: Grade | null; reason: string }[];
  checks: { visitId: string; trackId: string; outcome: TrackCheckOutcome }[];
  reviews: { id: string; visitId: string; comparedVisitId: string | null; status: "requested" | "in_progress" | "signed_off"; reviewerId: string | null }[];
  adjudications: {
    id: string; reviewId: string; trackId: string; verdict: Verdict; proposedStatus: TrackStatus | null;
    comment: string | null; resolvedAt: Date | null; createdAt: Date;
  }[];
}

export function assembleTimeline(rows: TimelineRows) {
  const { visits: visitRows, tracks: trackRows, lesions: lesionRows, biopsies: biopsyRows, treatments: treatmentRows, statuses: statusRows, checks: checkRows, reviews: reviewRows, adjudications: adjudicationRows } = rows;
  const patient = rows.patient;
  const biopsyLabels = new Map<string, string[]>();
  for (const b of biopsyRows) {
    if (!b.lesionId) continue;
    biopsyLabels.set(b.lesionId, [...(biopsyLabels.get(b.lesionId) ?? []), b.label]);
  }
  const grades = lesionGrades(lesionRows, biopsyRows);
  const treatedLesions = new Set(treatmentRows.map((t) => t.lesionId).filter(Boolean));
  // Written out field by field: an object spread here cost several times the rest of the assembly
  // for a 1,200-lesion timeline (npm run bench, timeline GET).
  const lesionDtos = lesionRows.map((l) => {
    const { histology, effectiveGrade } = grades.get(l.id)!;
    return {
      id: l.id, visitId: l.visitId, trackId: l.trackId, label: l.label, clockStartH: l.clockStartH, clockEndH: l.clockEndH,
      distanceStartCm: l.distanceStartCm, distanceEndCm: l.distanceEndCm, zone: l.zone, grade: l.grade, version: l.version,
      histology, effectiveGrade, biopsyLabels: biopsyLabels.get(l.id) ?? [], treated: treatedLesions.has(l.id),
    };
  });

  const byVisit = new Map<string, typeof lesionDtos>(visitRows.map((v) => [v.id, []]));
  for (const l of lesionDtos) byVisit.get(l.visitId)?.push(l);
  const perVisit = visitRows.map((v) => {
    const mine = byVisit.get(v.id)!;
    const counts: Record<string, number> = {};
    for (const l of mine) counts[l.effectiveGrade] = (counts[l.effectiveGrade] ?? 0) + 1;
    const arcs = treatmentRows.filter((t) => t.visitId === v.id).flatMap((t) => t.arcs);
    return { visitId: v.id, visitDate: v.visitDate, countsByGrade: counts, lesionCount: mine.length, treatedFraction: arcs.length ? unionLengthH(arcs) / 12 : 0 };
  });

  return {
    patient: { id: patient.id, siteId: patient.siteId, name: `${patient.familyName}, ${patient.givenName}`, mrn: patient.mrn },
    visits: visitRows,
    tracks: trackRows,
    lesions: lesionDtos,
    statuses: statusRows,
    checks: checkRows,
    perVisit,
    reviews: reviewRows.map((r) => ({ ...r, adjudications: adjudicationRows.filter((a) => a.reviewId === r.id) })),
  };
}

export type TimelineDto = ReturnType<typeof assembleTimeline>;
