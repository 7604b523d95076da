import { GRADE_LABEL, HISTOLOGY_LABEL, type Grade } from "@/lib/domain/vocab";
import { assessDoses, assessExtent, mgFromPercentAndMl } from "@/lib/dosing";
import { describeSite, formatClock, isFullCircle } from "@/lib/geometry";
import { ainLabel } from "@/lib/codes/last";
import { decideGrade } from "@/lib/tracking/effective-grade";
import * as W from "@/lib/domain/labels";
import type { VisitReportData } from "./types";

// The report's content as printed words and table rows, decided once here so the PDF
// drawing code only lays text out. Clock positions print in the lithotomy frame, as stored.

export type Row = string[];
export interface Table { columns: string[]; widths: number[]; rows: Row[]; empty: string }
export interface ReportModel {
  title: string;
  headerLines: [string, string][];
  findings: Table;
  biopsies: Table;
  treatments: Table;
  doses: Table;
  cautions: string[];
  complications: string[];
  diagnoses: string[];
  plan: string | null;
  addenda: { heading: string; body: string }[];
  signature: { signed: boolean; text: string };
}

const round1 = (n: number) => Math.round(n * 10) / 10;
const pct = (f: number) => `${Math.round(f * 100)}%`;
const dateTime = (iso: string) => iso.slice(0, 16).replace("T", " ") + " UTC";
const clockNum = (h: number) => formatClock(h).replace(" o'clock", "");

export function histologyText(b: { histology: VisitReportData["biopsies"][number]["histology"]; ainGrade: VisitReportData["biopsies"][number]["ainGrade"]; p16: VisitReportData["biopsies"][number]["p16"] }): string {
  if (!b.histology) return "Awaiting result";
  const base = HISTOLOGY_LABEL[b.histology];
  if (b.ainGrade) {
    const ain = ainLabel(b.ainGrade, b.p16 ?? "not_done");
    // "HSIL (AIN2, p16 block positive)" already names the tier; repeat it only when they differ.
    return ain.startsWith(`${base} (`) ? ain : `${base} · ${ain}`;
  }
  return b.p16 && b.p16 !== "not_done" ? `${base} · ${W.P16_WORDS[b.p16]}` : base;
}

export function buildReportModel(d: VisitReportData): ReportModel {
  const v = d.visit;
  const lesionLabel = new Map(d.lesions.map((l) => [l.id, l.label]));
  const worstHistology = new Map<string, NonNullable<VisitReportData["biopsies"][number]["histology"]>>();
  const order = ["benign", "lsil", "hsil", "scc"] as const;
  for (const b of d.biopsies) {
    if (!b.lesionId || !b.histology) continue;
    const prev = worstHistology.get(b.lesionId);
    if (!prev || order.indexOf(b.histology) > order.indexOf(prev)) worstHistology.set(b.lesionId, b.histology);
  }

  const findings: Table = {
    columns: ["Lesion", "Site", "Impression", "Histology", "Counts as", "Features"],
    widths: [0.09, 0.3, 0.12, 0.13, 0.12, 0.24],
    empty: "No lesions recorded at this visit.",
    rows: d.lesions.map((l) => {
      const h = worstHistology.get(l.id) ?? null;
      const decided = decideGrade(l.grade, h);
      const grade: Grade = l.effectiveGrade ?? decided.grade ?? l.grade;
      const features = [
        l.morphology ? W.MORPHOLOGY_WORDS[l.morphology] : null,
        l.acetowhite ? W.ACETOWHITE_WORDS[l.acetowhite] : null,
        l.lugol ? W.LUGOL_WORDS[l.lugol] : null,
        l.vessels.length ? l.vessels.join(", ") : null,
        l.sizeMm !== null ? `${round1(l.sizeMm)} mm` : null,
        l.trackStatus ? `track ${W.STATUS_WORDS[l.trackStatus]}` : null,
      ].filter(Boolean);
      return [
        l.trackLabel && l.trackLabel !== l.label ? `${l.label} (${l.trackLabel})` : l.label,
        `${describeSite(l.clockStartH, l.clockEndH, l.distanceStartCm, l.distanceEndCm)}; ${W.ZONE_WORDS[l.zone]}`,
        GRADE_LABEL[l.grade],
        h ? HISTOLOGY_LABEL[h] : "—",
        GRADE_LABEL[grade],
        features.join("; ") || "—",
      ];
    }),
  };

  const biopsies: Table = {
    columns: ["Specimen", "Lesion", "Site", "Histology"],
    widths: [0.12, 0.12, 0.36, 0.4],
    empty: "No biopsies taken.",
    rows: d.biopsies.map((b) => [
      b.specimenLabel,
      b.lesionId ? (lesionLabel.get(b.lesionId) ?? "—") : "—",
      `${formatClock(b.clockH)}, ${round1(b.distanceCm)} cm from the verge`,
      histologyText(b),
    ]),
  };

  const treatments: Table = {
    columns: ["Modality", "Lesion", "Treated arcs", "Share of circumference"],
    widths: [0.32, 0.12, 0.36, 0.2],
    empty: "No treatment given.",
    rows: d.treatments.map((t) => [
      W.MODALITY_WORDS[t.modality] + (t.regimen ? ` (${t.regimen})` : ""),
      t.lesionId ? (lesionLabel.get(t.lesionId) ?? "—") : "—",
      t.arcs.length ? t.arcs.map((a) => (isFullCircle(a) ? "the whole circumference" : `${clockNum(a.startH)} to ${formatClock(a.endH)}`)).join("; ") : "—",
      pct(assessExtent(t.arcs).fraction),
    ]),
  };

  const weightKg = v.patientWeightKg ?? undefined;
  const doses: Table = {
    columns: ["Agent", "Concentration", "Volume", "Epinephrine", "Dose"],
    widths: [0.26, 0.18, 0.16, 0.18, 0.22],
    empty: "No local anaesthetic recorded.",
    rows: d.doses.map((x) => [
      W.AGENT_WORDS[x.agent],
      `${x.concentrationPct} %`,
      `${round1(x.volumeMl)} mL`,
      x.withEpinephrine ? "with" : "without",
      `${round1(mgFromPercentAndMl(x.concentrationPct, x.volumeMl))} mg`,
    ]),
  };

  const cautions: string[] = [];
  const assessment = assessDoses(d.doses, weightKg);
  for (const a of assessment.agents) {
    const line = `${W.AGENT_WORDS[a.agent]} total ${round1(a.totalMg)} mg of a ${round1(a.maxMg)} mg maximum (${pct(a.fraction)}). ${a.explanation}`;
    cautions.push(a.level === "over" ? `Over the maximum: ${line}` : a.level === "near" ? `Near the maximum: ${line}` : line);
  }
  if (assessment.agents.length > 1) cautions.push(`Both agents together: ${pct(assessment.combined.fraction)} of the combined maximum.`);
  for (const x of d.doses.filter((x) => x.overrideReason)) {
    cautions.push(`Dose override recorded${x.overriddenByName ? ` by ${x.overriddenByName}` : ""}: ${x.overrideReason}`);
  }
  const allArcs = d.treatments.flatMap((t) => t.arcs);
  if (allArcs.length) cautions.push(assessExtent(allArcs).message);
  for (const t of d.treatments.filter((t) => t.extentOverrideReason)) cautions.push(`Extent override recorded: ${t.extentOverrideReason}`);
  if (cautions.length) cautions.push("Limits follow the product labels and local protocol; the treating clinician decides.");

  const headerLines: [string, string][] = [
    ["Patient", `${d.patient.familyName}, ${d.patient.givenName} · MRN ${d.patient.mrn} · born ${d.patient.dateOfBirth}`],
    ["Visit", `${v.visitDate} · ${d.siteName} · examiner ${v.examinerName}`],
    ["Position", `${W.POSITION_WORDS[v.patientPosition]} (clock positions below are printed in the lithotomy convention)`],
    ["Indication", v.indication ?? "—"],
    ["Cytology / HPV", `${W.CYTOLOGY_WORDS[v.cytology]} / ${W.HPV_WORDS[v.hpvResult]}`],
    ["Adequacy", v.adequacy ? W.ADEQUACY_WORDS[v.adequacy] : "—"],
    ["Exam time", v.examStartedAt ? `${dateTime(v.examStartedAt)}${v.examEndedAt ? ` to ${dateTime(v.examEndedAt).slice(11)}` : ""}` : "—"],
    ["Anaesthesia", [v.anaesthesia, v.patientWeightKg !== null ? `weight ${round1(v.patientWeightKg)} kg` : null].filter(Boolean).join(" · ") || "—"],
  ];

  return {
    title: `Visit report · ${v.visitDate}`,
    headerLines,
    findings,
    biopsies,
    treatments,
    doses,
    cautions,
    complications: d.complications.map(
      (c) => `${W.COMPLICATION_WORDS[c.kind]}, ${c.severity}, ${c.afterProcedure ? "after" : "during"} the procedure${c.note ? `: ${c.note}` : ""}`,
    ),
    diagnoses: d.diagnoses.map((x) => `${x.code} ${x.descriptor}`),
    plan: v.plan,
    addenda: d.addenda.map((a) => ({ heading: `${dateTime(a.createdAt)} · ${a.authorName}`, body: a.body })),
    signature:
      v.status === "signed" && v.signedAt
        ? { signed: true, text: `Signed by ${v.signerName ?? v.examinerName} on ${dateTime(v.signedAt)}. Changes after signing appear as addenda.` }
        : { signed: false, text: "DRAFT — not signed. This record may still change." },
  };
}
