import "server-only";
import { and, eq, inArray, lt, sql as dsql } from "drizzle-orm";
import { db } from "../../client";
import { qualityFigures, studyFigures } from "../../schema";

// Stored research figures (tables study_figures and quality_figures). They are read from and written to the
// primary: the rows are small, and a paused or lagging replica must not hide a refresh just made.

export interface StoredFigures<F> {
  siteId: string;
  computedAt: Date;
  figures: F;
}

export async function readStudyFigures<F>(studyId: string, siteIds: string[]): Promise<StoredFigures<F>[]> {
  if (!siteIds.length) return [];
  const rows = await db
    .select({ siteId: studyFigures.siteId, computedAt: studyFigures.computedAt, figures: studyFigures.figures })
    .from(studyFigures)
    .where(and(eq(studyFigures.studyId, studyId), inArray(studyFigures.siteId, siteIds)));
  return rows as StoredFigures<F>[];
}

/** Keeps the newer of two refreshes that raced: a slow, older one never overwrites a newer one. */
export async function saveStudyFigures<F>(studyId: string, siteId: string, computedAt: Date, figures: F): Promise<void> {
  await db
    .insert(studyFigures)
    .values({ studyId, siteId, computedAt, figures })
    .onConflictDoUpdate({
      target: [studyFigures.studyId, studyFigures.siteId],
      set: { computedAt: dsql`excluded.computed_at`, figures: dsql`excluded.figures` },
      setWhere: lt(studyFigures.computedAt, dsql`excluded.computed_at`),
    });
}

/** Stored clinic-quality figures of these sites for one year and look-back window (primary, as above). */
export async function readQualityFigures<F>(siteIds: string[], year: number, windowDays: number): Promise<StoredFigures<F>[]> {
  if (!siteIds.length) return [];
  const rows = await db
    .select({ siteId: qualityFigures.siteId, computedAt: qualityFigures.computedAt, figures: qualityFigures.figures })
    .from(qualityFigures)
    .where(and(inArray(qualityFigures.siteId, siteIds), eq(qualityFigures.year, year), eq(qualityFigures.windowDays, windowDays)));
  return rows as StoredFigures<F>[];
}

export async function saveQualityFigures<F>(siteId: string, year: number, windowDays: number, computedAt: Date, figures: F): Promise<void> {
  await db
    .insert(qualityFigures)
    .values({ siteId, year, windowDays, computedAt, figures })
    .onConflictDoUpdate({
      target: [qualityFigures.siteId, qualityFigures.year, qualityFigures.windowDays],
      set: { computedAt: dsql`excluded.computed_at`, figures: dsql`excluded.figures` },
      setWhere: lt(qualityFigures.computedAt, dsql`excluded.computed_at`),
    });
}

/** Drops a study site's stored figures, so the next load works them out before it answers. */
export async function forgetStudyFigures(studyId: string, siteId: string): Promise<void> {
  await db.delete(studyFigures).where(and(eq(studyFigures.studyId, studyId), eq(studyFigures.siteId, siteId)));
}
