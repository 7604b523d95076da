// Seeds the invented demo scenario. Idempotent: when the demo sites exist, it adds nothing.
// Run with: npm run db:seed (scripts/start.sh does).
import { inArray } from "drizzle-orm";
import { db, runScript, sql } from "../client";
import * as s from "../schema";
import { hashPassword } from "@/lib/auth/password";
import { mgFromPercentAndMl } from "@/lib/dosing/anaesthetic";
import { treatedFraction } from "@/lib/dosing/extent";
import { DEMO_PASSWORD, DEMO_SITES, DEMO_USERS, buildScenario, zoneOf } from "./scenario";
import { afterSeed } from "./after-seed";

async function main() {
  const existing = await db.select({ id: s.sites.id }).from(s.sites).where(inArray(s.sites.code, DEMO_SITES.map((x) => x.code)));
  if (existing.length > 0) {
    console.log("demo data already present: nothing added");
    return;
  }
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const scenario = buildScenario();
  await db.transaction(async (tx) => {
    const sites = await tx.insert(s.sites).values(DEMO_SITES.map((x) => ({ code: x.code, name: x.name }))).returning();
    const siteId = (code: string) => sites.find((x) => x.code === code)!.id;
    await tx.insert(s.users).values(DEMO_USERS.map((u) => ({ id: u.id, email: u.email, displayName: u.displayName, role: u.role, passwordHash })));
    await tx.insert(s.userSites).values(DEMO_USERS.flatMap((u) => u.sites.map((c) => ({ userId: u.id, siteId: siteId(c) }))));

    const [study] = await tx.insert(s.studies).values({ code: "HBR-ABL-01", title: "Outcomes after office ablation of anal HSIL", startDate: "2023-05-01" }).returning();
    await tx.insert(s.studySites).values({ studyId: study!.id, siteId: siteId("HBR") });

    let subject = 0;
    let withdrawnDone = false;
    for (const p of scenario) {
      const sid = siteId(p.siteCode);
      const [patient] = await tx.insert(s.patients).values({
        siteId: sid, mrn: p.mrn, familyName: p.familyName, givenName: p.givenName, dateOfBirth: p.dateOfBirth,
        sexAtBirth: p.sexAtBirth, genderIdentity: p.genderIdentity, hivStatus: p.hivStatus, riskGroups: [p.riskGroup],
        zip: p.zip, contactEmail: p.email, consentEmail: p.consentEmail, consentResearch: p.consentResearch,
        clinicianId: p.visits[0]?.examiner,
      }).returning({ id: s.patients.id });
      const trackIds = new Map<string, string>();
      for (const [vi, v] of p.visits.entries()) {
        const last = vi === p.visits.length - 1;
        const [visit] = await tx.insert(s.visits).values({
          patientId: patient!.id, siteId: sid, visitDate: v.date, examinerId: v.examiner, patientPosition: vi % 3 === 2 ? "prone_jackknife" : "lithotomy",
          indication: vi === 0 ? "Abnormal anal cytology" : "Surveillance after previous findings", cytology: vi === 0 ? "hsil" : "not_done",
          adequacy: "scj_full", patientWeightKg: 62 + (p.mrn.charCodeAt(6) % 30),
          examStartedAt: new Date(`${v.date}T09:00:00Z`), examEndedAt: new Date(`${v.date}T09:${10 + (vi % 4) * 2}:00Z`),
          status: last ? "draft" : "signed", signedAt: last ? null : new Date(`${v.date}T10:00:00Z`), signedBy: last ? null : v.examiner,
        }).returning({ id: s.visits.id });
        let label = 0;
        let specimen = 0;
        let anyTreated = false;
        for (const l of v.lesions) {
          let trackId = trackIds.get(l.trackKey);
          if (!trackId) {
            const [t] = await tx.insert(s.lesionTracks).values({ patientId: patient!.id, siteId: sid, label: l.trackKey }).returning({ id: s.lesionTracks.id });
            trackId = t!.id;
            trackIds.set(l.trackKey, trackId);
          }
          const [lesion] = await tx.insert(s.lesions).values({
            visitId: visit!.id, siteId: sid, trackId, label: `L${++label}`, clockStartH: l.clockStartH, clockEndH: l.clockEndH,
            distanceStartCm: l.distanceStartCm, distanceEndCm: l.distanceEndCm, zone: zoneOf(l.distanceStartCm, l.distanceEndCm),
            grade: l.grade, morphology: l.grade === "condyloma" ? "papillary" : l.grade === "hsil" ? "flat" : "raised",
            acetowhite: l.grade === "hsil" ? "dense" : "faint", lugol: l.grade === "hsil" ? "negative" : "partial",
            vessels: l.grade === "hsil" ? ["punctation", "mosaic"] : [], sizeMm: 3 + label * 2,
          }).returning({ id: s.lesions.id });
          if (l.histology) {
            await tx.insert(s.biopsies).values({
              visitId: visit!.id, siteId: sid, lesionId: lesion!.id, specimenLabel: String.fromCharCode(65 + specimen++),
              clockH: l.clockStartH, distanceCm: l.distanceStartCm,
              histology: last && specimen === 1 ? null : l.histology, p16: l.histology === "hsil" ? "block_positive" : "not_done",
              resultEnteredAt: last && specimen === 1 ? null : new Date(`${v.date}T12:00:00Z`), resultEnteredBy: last && specimen === 1 ? null : v.examiner,
            });
          }
          if (l.treated) {
            const arcs = [{ startH: l.clockStartH, endH: l.clockEndH }];
            await tx.insert(s.treatments).values({ visitId: visit!.id, siteId: sid, lesionId: lesion!.id, treatedLesionIds: [lesion!.id], modality: l.treated, arcs, treatedFraction: treatedFraction(arcs) });
            anyTreated = true;
          }
        }
        if (anyTreated) {
          await tx.insert(s.anaestheticDoses).values({ visitId: visit!.id, siteId: sid, agent: "lidocaine", concentrationPct: 1, volumeMl: 5, withEpinephrine: false, doseMg: mgFromPercentAndMl(1, 5) });
        }
        for (const key of v.notFound) {
          const trackId = trackIds.get(key);
          if (trackId) await tx.insert(s.trackChecks).values({ visitId: visit!.id, trackId, siteId: sid, outcome: "not_found" });
        }
      }
      if (p.siteCode === "HBR" && p.consentResearch) {
        subject++;
        // One participant withdraws the day after their first visit, so exports show the cut.
        const withdraws = !withdrawnDone && p.visits.length >= 3;
        if (withdraws) withdrawnDone = true;
        const next = new Date(`${p.visits[0]!.date}T00:00:00Z`);
        next.setUTCDate(next.getUTCDate() + 1);
        await tx.insert(s.researchConsents).values({
          patientId: patient!.id, studyId: study!.id, siteId: sid, consentedOn: p.visits[0]!.date, formVersion: "1", recordedBy: p.visits[0]!.examiner,
          withdrawnOn: withdraws ? next.toISOString().slice(0, 10) : null, withdrawnBy: withdraws ? p.visits[0]!.examiner : null,
        });
        await tx.insert(s.enrolments).values({
          studyId: study!.id, patientId: patient!.id, siteId: sid, studySubjectId: `ABL-${String(subject).padStart(3, "0")}`,
          consentDate: p.visits[0]!.date, withdrawnOn: withdraws ? next.toISOString().slice(0, 10) : null,
        });
      }
    }
  });
  await afterSeed();
  const [{ n }] = await sql`select count(*)::int as n from patients`;
  console.log(`demo data seeded: ${n} patients`);
}

runScript(main);
