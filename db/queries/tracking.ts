import { and, eq, inArray, isNotNull, sql as dsql } from "drizzle-orm";
import { biopsies, lesions, trackChecks, trackStatuses, treatments, visits, lesionTracks } from "../schema";
import { prepared, type Db, type Tx } from "../client";
import { rowsOf } from "./json-rows";
import { pgArrayLiteral } from "./scope";
import { HISTOLOGY, type Histology } from "@/lib/domain/vocab";
import { trackStatuses as computeStatuses, withMetachronousContext, type TrackHistory } from "@/lib/tracking";

type Runner = Db | Tx;

const HISTOLOGY_RANK = Object.fromEntries(HISTOLOGY.map((h, i) => [h, i])) as Record<Histology, number>;

type Visit = typeof visits.$inferSelect;
type Lesion = typeof lesions.$inferSelect;
type StoredStatus = Pick<typeof trackStatuses.$inferSelect, "trackId" | "visitId" | "siteId" | "status" | "effectiveGrade" | "reason">;

const patientParam = dsql.placeholder("patientId");
const ofPatient = eq(visits.patientId, patientParam);

// A patient's whole track history and its stored statuses in one statement, built once (every
// lesion write runs it): each part is a JSON array of rows, so the driver parses one value per part.
const historyOfPatient = prepared((run) =>
  run
    .select({
      visits: rowsOf<[string, Visit["visitDate"], Visit["status"]]>([visits.id, visits.visitDate, visits.status], dsql`from ${visits} where ${ofPatient}`, dsql`${visits.visitDate}, ${visits.createdAt}`),
      tracks: rowsOf<[string, string]>([lesionTracks.id, lesionTracks.label], dsql`from ${lesionTracks} where ${eq(lesionTracks.patientId, patientParam)}`),
      lesions: rowsOf<[string, string, string, Lesion["grade"]]>(
        [lesions.id, lesions.visitId, lesions.trackId, lesions.grade],
        dsql`from ${lesions} inner join ${visits} on ${eq(visits.id, lesions.visitId)} where ${and(ofPatient, isNotNull(lesions.trackId))}`,
      ),
      biopsies: rowsOf<[string | null, Histology]>(
        [biopsies.lesionId, biopsies.histology],
        dsql`from ${biopsies} inner join ${visits} on ${eq(visits.id, biopsies.visitId)} where ${and(ofPatient, isNotNull(biopsies.histology))}`,
      ),
      treatments: rowsOf<[string | null, string]>([treatments.lesionId, treatments.visitId], dsql`from ${treatments} inner join ${visits} on ${eq(visits.id, treatments.visitId)} where ${ofPatient}`),
      checks: rowsOf<[string, string, (typeof trackChecks.$inferSelect)["outcome"]]>(
        [trackChecks.visitId, trackChecks.trackId, trackChecks.outcome],
        dsql`from ${trackChecks} inner join ${visits} on ${eq(visits.id, trackChecks.visitId)} where ${ofPatient}`,
      ),
      statuses: rowsOf<[string, string, string, StoredStatus["status"], StoredStatus["effectiveGrade"], StoredStatus["reason"]]>(
        [trackStatuses.trackId, trackStatuses.visitId, trackStatuses.siteId, trackStatuses.status, trackStatuses.effectiveGrade, trackStatuses.reason],
        dsql`from ${trackStatuses} inner join ${lesionTracks} on ${eq(lesionTracks.id, trackStatuses.trackId)} where ${eq(lesionTracks.patientId, patientParam)}`,
      ),
    })
    .from(dsql`(select) as one`),
);

async function readHistory(run: Runner, patientId: string) {
  const [row] = await historyOfPatient(run, { patientId });
  return row!;
}

/**
 * Every track of one patient with one observation per visit, read in one statement whatever the
 * number of visits and lesions. A signed visit is a complete exam: a track without a lesion there
 * was looked for and not found. On a draft only an explicit "not found" counts.
 */
export async function loadTrackHistories(run: Runner, patientId: string): Promise<TrackHistory[]> {
  return historiesOf(await readHistory(run, patientId));
}

function historiesOf(h: Awaited<ReturnType<typeof readHistory>>): TrackHistory[] {
  const visitRows = h.visits.map(([id, visitDate, status]) => ({ id, visitDate, status }));
  const tracks = h.tracks.map(([id, label]) => ({ id, label }));
  const lesionRows = h.lesions.map(([id, visitId, trackId, grade]) => ({ id, visitId, trackId, grade }));
  const biopsyRows = h.biopsies.map(([lesionId, histology]) => ({ lesionId, histology }));
  const treatmentRows = h.treatments.map(([lesionId, visitId]) => ({ lesionId, visitId }));
  const checkRows = h.checks.map(([visitId, trackId, outcome]) => ({ visitId, trackId, outcome }));
  if (visitRows.length === 0 || tracks.length === 0) return [];
  // The worst histology among a lesion's biopsies decides.
  const histologyByLesion = new Map<string, Histology>();
  for (const b of biopsyRows) {
    if (!b.lesionId || !b.histology) continue;
    const prev = histologyByLesion.get(b.lesionId);
    if (!prev || HISTOLOGY_RANK[b.histology] > HISTOLOGY_RANK[prev]) histologyByLesion.set(b.lesionId, b.histology);
  }
  const treatedLesions = new Set(treatmentRows.map((t) => t.lesionId).filter(Boolean));
  const lesionAt = new Map<string, (typeof lesionRows)[number]>();
  for (const l of lesionRows) lesionAt.set(`${l.trackId}|${l.visitId}`, l);
  const checkAt = new Map(checkRows.map((c) => [`${c.trackId}|${c.visitId}`, c.outcome]));

  return tracks.map((t) => ({
    trackId: t.id,
    label: t.label,
    observations: visitRows.map((v) => {
      const l = lesionAt.get(`${t.id}|${v.id}`);
      const check = checkAt.get(`${t.id}|${v.id}`);
      if (l) {
        return { visitId: v.id, visitDate: v.visitDate, seen: true, lookedFor: true, impressionGrade: l.grade, histology: histologyByLesion.get(l.id) ?? null, treatedAtVisit: treatedLesions.has(l.id) };
      }
      return { visitId: v.id, visitDate: v.visitDate, seen: false, lookedFor: check !== undefined || v.status === "signed", treatedAtVisit: check === "treated" };
    }),
  }));
}

type StatusRow = typeof trackStatuses.$inferInsert;

// Status rows written, however many, as one statement built once: each column is one array
// parameter, turned back into rows by unnest (in the table's column order).
const ph = (name: string) => dsql.placeholder(name);
const upsertStatuses = prepared((run) =>
  run
    .insert(trackStatuses)
    .select(
      dsql`select * from unnest(${ph("trackIds")}::uuid[], ${ph("visitIds")}::uuid[], ${ph("siteIds")}::uuid[], ${ph("statuses")}::track_status[], ${ph("grades")}::grade[], ${ph("reasons")}::text[])`,
    )
    .onConflictDoUpdate({
      target: [trackStatuses.trackId, trackStatuses.visitId],
      set: { siteId: dsql`excluded.site_id`, status: dsql`excluded.status`, effectiveGrade: dsql`excluded.effective_grade`, reason: dsql`excluded.reason` },
    }),
);
const sameRow = (a: StatusRow, b: StatusRow) =>
  a.status === b.status && (a.effectiveGrade ?? null) === (b.effectiveGrade ?? null) && a.reason === b.reason && a.siteId === b.siteId;

/**
 * Recomputes every track status of one patient (lib/tracking decides; a track's status can depend
 * on the patient's other tracks) and stores the result. Only rows that differ from the stored ones
 * are written, so the table ends exactly as a full rewrite would leave it, but a write that
 * changes one track touches only that track's rows.
 */
export async function refreshTrackStatuses(run: Runner, patientId: string, siteId: string): Promise<void> {
  const read = await readHistory(run, patientId);
  const histories = historiesOf(read);
  const storedRows: StatusRow[] = read.statuses.map(([trackId, visitId, siteId, status, effectiveGrade, reason]) => ({ trackId, visitId, siteId, status, effectiveGrade, reason }));
  const computed = new Map<string, StatusRow[]>();
  for (const h of withMetachronousContext(histories)) {
    computed.set(
      h.trackId,
      computeStatuses(h.observations, { earlierDiseaseElsewhere: h.earlierDiseaseElsewhere })
        .filter((s) => s.status !== null)
        .map((s) => ({ trackId: h.trackId, visitId: s.visitId, siteId, status: s.status!, effectiveGrade: s.effectiveGrade, reason: s.reason })),
    );
  }
  const stored = new Map<string, StatusRow>();
  for (const r of storedRows) stored.set(`${r.trackId}|${r.visitId}`, r);
  // Rows that are new or differ are written; stored rows of a recomputed track that the
  // recomputation no longer yields are removed. The two sets are disjoint: sent together.
  const upserts: StatusRow[] = [];
  const keep = new Set<string>();
  for (const rows of computed.values()) {
    for (const r of rows) {
      const key = `${r.trackId}|${r.visitId}`;
      keep.add(key);
      const old = stored.get(key);
      if (!old || !sameRow(old, r)) upserts.push(r);
    }
  }
  const stale = new Map<string, string[]>();
  for (const [key, r] of stored) {
    if (keep.has(key) || !computed.has(r.trackId)) continue;
    stale.set(r.trackId, [...(stale.get(r.trackId) ?? []), r.visitId]);
  }
  await Promise.all([
    ...[...stale].map(([trackId, visitIds]) => run.delete(trackStatuses).where(and(eq(trackStatuses.trackId, trackId), inArray(trackStatuses.visitId, visitIds)))),
    upserts.length
      ? upsertStatuses(run, {
          trackIds: pgArrayLiteral(upserts.map((r) => r.trackId)),
          visitIds: pgArrayLiteral(upserts.map((r) => r.visitId)),
          siteIds: pgArrayLiteral(upserts.map((r) => r.siteId)),
          statuses: pgArrayLiteral(upserts.map((r) => r.status)),
          grades: pgArrayLiteral(upserts.map((r) => r.effectiveGrade ?? null)),
          reasons: pgArrayLiteral(upserts.map((r) => r.reason)),
        })
      : null,
  ]);
}

