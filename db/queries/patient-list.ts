import "server-only";
// The patient list in one statement: each patient of the caller's sites with the latest visit, the
// worst effective grade of their tracks at the latest signed visit (a draft has no statuses), and
// the open review disagreements.
import { sql } from "drizzle-orm";
import { db } from "../client";
import { pgArrayLiteral, type SiteScope } from "./scope";
import type { Grade, PatientStatus } from "@/lib/domain/vocab";

export const LIST_PAGE_SIZE = 25;

export type ListSort = "name" | "mrn" | "lastVisit" | "grade" | "disagreements" | "order";

export interface PatientListQuery {
  q?: string;
  page: number;
  sort: ListSort;
  dir: "asc" | "desc";
  /** Grades from mildest to worst (the caller's ranking), so "worst" is decided in one place. */
  gradesByRank: readonly Grade[];
  /** For sort "order": patient ids in the wanted order (others follow, by name). */
  orderIds?: readonly string[];
}

export interface PatientListRow {
  id: string;
  mrn: string;
  familyName: string;
  givenName: string;
  dateOfBirth: string;
  status: PatientStatus;
  lastVisit: string | null;
  grade: Grade | null;
  disagreements: number;
}

const ORDER: Record<ListSort, string> = {
  name: "lower(family_name) %s, lower(given_name) %s",
  mrn: "mrn %s",
  lastVisit: "last_visit %s NULLS LAST",
  grade: "grade_rank %s NULLS LAST",
  disagreements: "disagreements %s",
  order: "order_pos %s NULLS LAST",
};

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export async function patientList(scope: SiteScope, f: PatientListQuery) {
  const q = f.q?.trim();
  const like = q ? `%${escapeLike(q)}%` : null;
  const dir = f.dir === "desc" ? "DESC" : "ASC";
  const order = sql.raw(`${ORDER[f.sort].replaceAll("%s", dir)}, lower(family_name), lower(given_name), id`);
  const rows = (await db.execute(sql`
    WITH ranked AS (SELECT ${pgArrayLiteral(f.gradesByRank)}::text[] AS g),
    listed AS (
      SELECT p.id, p.mrn, p.family_name, p.given_name, p.date_of_birth, p.status, lv.visit_date AS last_visit,
        (SELECT max(array_position(ranked.g, ts.effective_grade::text)) FROM track_statuses ts
          WHERE ts.visit_id = ls.id AND ts.effective_grade IS NOT NULL) AS grade_rank,
        (SELECT count(*) FROM adjudications a JOIN reviews r ON r.id = a.review_id
          WHERE r.patient_id = p.id AND a.verdict = 'disagree' AND a.resolved_at IS NULL)::int AS disagreements,
        array_position(${pgArrayLiteral(f.orderIds ?? [])}::uuid[], p.id) AS order_pos
      FROM patients p
      CROSS JOIN ranked
      LEFT JOIN LATERAL (SELECT v.id, v.visit_date FROM visits v WHERE v.patient_id = p.id
        ORDER BY v.visit_date DESC, v.created_at DESC LIMIT 1) lv ON true
      LEFT JOIN LATERAL (SELECT v.id FROM visits v WHERE v.patient_id = p.id AND v.status = 'signed'
        ORDER BY v.visit_date DESC, v.created_at DESC LIMIT 1) ls ON true
      WHERE p.site_id = any(${pgArrayLiteral(scope.siteIds)}::uuid[])
        AND (${like}::text IS NULL OR p.family_name ILIKE ${like} OR p.given_name ILIKE ${like} OR p.mrn ILIKE ${like})
    )
    SELECT listed.*, (SELECT g[grade_rank] FROM ranked) AS grade, count(*) OVER () AS total
    FROM listed ORDER BY ${order}
    LIMIT ${LIST_PAGE_SIZE} OFFSET ${(f.page - 1) * LIST_PAGE_SIZE}
  `)) as unknown as Record<string, unknown>[];
  const total = rows.length ? Number(rows[0]!.total) : 0;
  return {
    rows: rows.map((r): PatientListRow => ({
      id: String(r.id), mrn: String(r.mrn), familyName: String(r.family_name), givenName: String(r.given_name),
      dateOfBirth: String(r.date_of_birth), status: r.status as PatientStatus, lastVisit: (r.last_visit as string | null) ?? null,
      grade: (r.grade as Grade | null) ?? null, disagreements: Number(r.disagreements),
    })),
    total,
    page: f.page,
    pageCount: Math.max(1, Math.ceil(total / LIST_PAGE_SIZE)),
  };
}
