// A small but complete clinic (site A) with one record of every kind a route can address,
// plus a user of every role at site A and at a second site B. The access matrix and the fuzz
// tests address site A's records by these ids.
import { createHash, randomUUID } from "node:crypto";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { ROLES, type Role } from "@/lib/domain/vocab";
import { patientReference } from "@/db/queries/research/enrolment";
import { actor, consentTo, makePatient, makeSite, makeUser, type Actor } from "../fixtures/factory";

export interface World {
  siteA: string;
  siteB: string;
  /** One actor per role at each site. */
  a: Record<Role, Actor>;
  b: Record<Role, Actor>;
  ids: {
    patientId: string;
    draftVisitId: string;
    signedVisitId: string;
    trackId: string;
    lesionId: string;
    signedLesionId: string;
    biopsyId: string;
    treatmentId: string;
    doseId: string;
    complicationId: string;
    attachmentId: string;
    reviewId: string;
    adjudicationId: string;
    studyId: string;
    enrolmentId: string;
    subjectId: string;
    candidatePatientId: string;
    consentId: string;
    invitationId: string;
    targetUserId: string;
  };
}

async function actors(siteId: string): Promise<Record<Role, Actor>> {
  const out = {} as Record<Role, Actor>;
  for (const role of ROLES) out[role] = await actor(role, [siteId]);
  return out;
}

/** Builds the records of site A; call again for a fresh copy when a test will change them. */
export async function makeRecords(siteA: string, a: Record<Role, Actor>): Promise<World["ids"]> {
  const clin = a.clinician.userId;
  const patient = await makePatient(siteA);
  const [track] = await db.insert(s.lesionTracks).values({ patientId: patient.id, siteId: siteA, label: "T1" }).returning();
  const [signed] = await db
    .insert(s.visits)
    .values({ patientId: patient.id, siteId: siteA, visitDate: "2025-06-02", examinerId: clin, status: "signed", signedAt: new Date(), signedBy: clin })
    .returning();
  const [draft] = await db.insert(s.visits).values({ patientId: patient.id, siteId: siteA, visitDate: "2026-03-02", examinerId: clin }).returning();
  const lesionBase = { siteId: siteA, trackId: track!.id, label: "L1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone" as const, grade: "hsil" as const };
  const [signedLesion] = await db.insert(s.lesions).values({ ...lesionBase, visitId: signed!.id }).returning();
  const [lesion] = await db.insert(s.lesions).values({ ...lesionBase, visitId: draft!.id }).returning();
  const [biopsy] = await db.insert(s.biopsies).values({ visitId: draft!.id, siteId: siteA, lesionId: lesion!.id, specimenLabel: "A", clockH: 2, distanceCm: 1.5 }).returning();
  const [treatment] = await db
    .insert(s.treatments)
    .values({ visitId: draft!.id, siteId: siteA, lesionId: lesion!.id, modality: "electrocautery", arcs: [{ startH: 1, endH: 3 }], treatedFraction: 2 / 12 })
    .returning();
  const [dose] = await db
    .insert(s.anaestheticDoses)
    .values({ visitId: draft!.id, siteId: siteA, agent: "lidocaine", concentrationPct: 1, volumeMl: 5, withEpinephrine: false, doseMg: 50 })
    .returning();
  await db.insert(s.visitDiagnoses).values({ visitId: draft!.id, siteId: siteA, code: "K62.82", descriptor: "Dysplasia of anus", confirmedBy: clin });
  const [complication] = await db.insert(s.complications).values({ visitId: draft!.id, siteId: siteA, kind: "pain", severity: "mild" }).returning();
  // The row alone: no object in the store is needed to be refused (401/403/404).
  const attachmentId = randomUUID();
  await db.insert(s.attachments).values({
    id: attachmentId, visitId: draft!.id, siteId: siteA, kind: "photo", contentType: "image/jpeg", byteSize: 10,
    sha256: "0".repeat(64), objectKey: `quality/${attachmentId}.jpg`, uploadedBy: clin,
  });
  const [review] = await db
    .insert(s.reviews)
    .values({ patientId: patient.id, siteId: siteA, visitId: signed!.id, reviewerId: a.reviewer.userId, requestedBy: clin })
    .returning();
  const [adjudication] = await db
    .insert(s.adjudications)
    .values({ reviewId: review!.id, siteId: siteA, trackId: track!.id, verdict: "disagree", proposedStatus: "persistent", comment: "Invented disagreement." })
    .returning();
  const [study] = await db.insert(s.studies).values({ code: `Q-${randomUUID().slice(0, 8)}`, title: "Invented quality study", startDate: "2024-01-01" }).returning();
  await db.insert(s.studySites).values({ studyId: study!.id, siteId: siteA });
  const enrolled = await makePatient(siteA, { consentResearch: true });
  const subjectId = `QS-${randomUUID().slice(0, 6)}`;
  const [enrolment] = await db
    .insert(s.enrolments)
    .values({ studyId: study!.id, patientId: enrolled.id, siteId: siteA, studySubjectId: subjectId, consentDate: "2024-05-01" })
    .returning();
  const candidate = await makePatient(siteA, { consentResearch: true });
  const patientConsent = await consentTo(patient.id, study!.id, siteA);
  await consentTo(enrolled.id, study!.id, siteA);
  await consentTo(candidate.id, study!.id, siteA);
  const [invitation] = await db
    .insert(s.invitations)
    .values({
      email: `inv-${randomUUID()}@test.example`, siteId: siteA, role: "clinician",
      tokenHash: createHash("sha256").update(randomUUID()).digest("hex"), expiresAt: new Date(Date.now() + 86_400_000), invitedBy: a.admin.userId,
    })
    .returning();
  const targetUserId = await makeUser("clinician", [siteA]);
  return {
    patientId: patient.id, draftVisitId: draft!.id, signedVisitId: signed!.id, trackId: track!.id, lesionId: lesion!.id,
    signedLesionId: signedLesion!.id, biopsyId: biopsy!.id, treatmentId: treatment!.id, doseId: dose!.id, complicationId: complication!.id,
    attachmentId, reviewId: review!.id, adjudicationId: adjudication!.id, studyId: study!.id, enrolmentId: enrolment!.id, subjectId,
    candidatePatientId: candidate.id, consentId: patientConsent.id, invitationId: invitation!.id, targetUserId,
  };
}

export async function makeWorld(): Promise<World> {
  const siteA = (await makeSite("A")).id;
  const siteB = (await makeSite("B")).id;
  const a = await actors(siteA);
  const b = await actors(siteB);
  return { siteA, siteB, a, b, ids: await makeRecords(siteA, a) };
}

/** Route parameter name → the site-A record it names. Visit-level routes use the draft visit. */
export function paramsFor(ids: World["ids"]): Record<string, string> {
  return {
    patientId: ids.patientId, visitId: ids.draftVisitId, lesionId: ids.lesionId, biopsyId: ids.biopsyId, treatmentId: ids.treatmentId,
    doseId: ids.doseId, id: ids.complicationId, attachmentId: ids.attachmentId, reviewId: ids.reviewId, adjudicationId: ids.adjudicationId,
    studyId: ids.studyId, enrolmentId: ids.enrolmentId, subjectId: ids.subjectId, invitationId: ids.invitationId, userId: ids.targetUserId,
    dataset: "lesions",
  };
}

export { patientReference };
