import type { VisitReportData } from "./types";

// An invented visit for tests and for looking at the PDF by eye. No real patient.
export function sampleReport(): VisitReportData {
  return {
    siteId: "11111111-1111-4111-8111-111111111111",
    patientId: "22222222-2222-4222-8222-222222222222",
    siteName: "Harbour Street clinic",
    patient: { mrn: "INV-0042", familyName: "Example", givenName: "Robin", dateOfBirth: "1979-05-14", sexAtBirth: "male" },
    visit: {
      visitId: "33333333-3333-4333-8333-333333333333",
      visitDate: "2026-03-02",
      status: "draft",
      patientPosition: "left_lateral",
      indication: "Surveillance after HSIL at 1 o'clock",
      cytology: "hsil",
      hpvResult: "hr_positive_16",
      adequacy: "scj_full",
      examStartedAt: "2026-03-02T09:05:00.000Z",
      examEndedAt: "2026-03-02T09:32:00.000Z",
      anaesthesia: "Local infiltration",
      patientWeightKg: 70,
      plan: "Review histology; repeat exam in 6 months.",
      signedAt: null,
      examinerName: "Dr Invented Examiner",
      signerName: null,
    },
    lesions: [
      { id: "l1", label: "L1", trackLabel: "#1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil", morphology: "flat", acetowhite: "dense", lugol: "negative", vessels: ["punctation"], sizeMm: 8, note: null, trackStatus: "persistent", effectiveGrade: null },
      { id: "l2", label: "L2", trackLabel: "#2", clockStartH: 6, clockEndH: 7.5, distanceStartCm: 0, distanceEndCm: 1, zone: "distal_canal", grade: "lsil", morphology: "raised", acetowhite: "faint", lugol: null, vessels: [], sizeMm: null, note: null, trackStatus: "new", effectiveGrade: null },
      { id: "l3", label: "L3", trackLabel: null, clockStartH: 10, clockEndH: 10.2, distanceStartCm: -1.2, distanceEndCm: -1, zone: "perianal", grade: "condyloma", morphology: "papillary", acetowhite: null, lugol: null, vessels: [], sizeMm: 3, note: null, trackStatus: null, effectiveGrade: null },
    ],
    biopsies: [
      { id: "b1", lesionId: "l1", specimenLabel: "A", clockH: 2, distanceCm: 1.5, histology: "hsil", ainGrade: "ain2", p16: "block_positive", resultEnteredAt: "2026-03-09T12:00:00.000Z" },
      { id: "b2", lesionId: "l2", specimenLabel: "B", clockH: 6.5, distanceCm: 0.5, histology: null, ainGrade: null, p16: null, resultEnteredAt: null },
    ],
    treatments: [
      { id: "t1", lesionId: "l1", modality: "infrared_coagulation", regimen: null, arcs: [{ startH: 1, endH: 3 }], treatedFraction: 2 / 12, extentOverrideReason: null, note: null },
    ],
    doses: [
      { id: "d1", agent: "lidocaine", concentrationPct: 1, volumeMl: 8, withEpinephrine: false, doseMg: 80, overrideReason: null, overriddenByName: null },
    ],
    complications: [{ kind: "bleeding", severity: "mild", afterProcedure: false, note: "Settled with pressure" }],
    addenda: [],
    diagnoses: [{ code: "K62.82", descriptor: "Dysplasia of anus" }],
  };
}
