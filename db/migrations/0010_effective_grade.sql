-- The grade a sighting counts as, in SQL, for the exports, the study dashboard and the quality
-- panel. lib/tracking/effective-grade.ts (decideGrade) and lib/domain/vocab.ts (GRADE_TIER,
-- HISTOLOGY_AS_GRADE) are the specification; tests/integration/effective-grade-sql.test.ts checks
-- these functions against them on every grade x histology case.

-- Histology, when there is one, decides; the exam impression otherwise (LAST: Darragh TM et al.,
-- Arch Pathol Lab Med 2012;136:1266-97). SCC on histology is the top of the scale.
CREATE OR REPLACE FUNCTION dentate_effective_grade(impression grade, histology histology) RETURNS grade
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT CASE histology
    WHEN 'benign' THEN 'benign'::grade
    WHEN 'lsil' THEN 'lsil'::grade
    WHEN 'hsil' THEN 'hsil'::grade
    WHEN 'scc' THEN 'suspected_cancer'::grade
    ELSE impression
  END
$$;--> statement-breakpoint

-- Tier for progression and HSIL-or-worse: condyloma and LSIL are one low-grade tier under LAST.
CREATE OR REPLACE FUNCTION dentate_grade_tier(g grade) RETURNS integer
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT CASE g
    WHEN 'benign' THEN 0
    WHEN 'condyloma' THEN 1
    WHEN 'lsil' THEN 1
    WHEN 'hsil' THEN 2
    WHEN 'suspected_cancer' THEN 3
  END
$$;--> statement-breakpoint

-- A lesion's effective grade: its worst histology (enum order benign < lsil < hsil < scc) over the
-- impression. STABLE: it reads the lesion's biopsies.
CREATE OR REPLACE FUNCTION dentate_lesion_grade(lesion_id uuid, impression grade) RETURNS grade
LANGUAGE sql STABLE PARALLEL SAFE AS $$
  SELECT dentate_effective_grade(impression, (SELECT max(b.histology) FROM biopsies b WHERE b.lesion_id = $1))
$$;
