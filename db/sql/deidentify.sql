-- HIPAA Safe Harbor (45 CFR 164.514(b)(2)) as SQL functions, so research exports can stream
-- straight out of PostgreSQL with COPY. They mirror lib/deidentify (the tested specification);
-- tests/integration/research-deidentify.test.ts checks that both agree on the same records.

-- First three digits of a US ZIP (5 digits, optional ZIP+4), or '000' for malformed input and for
-- the 17 restricted 3-digit areas of the HHS guidance (2000 Census, 20,000 people or fewer).
CREATE OR REPLACE FUNCTION dentate_zip3(zip text) RETURNS text
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT CASE
    WHEN m IS NULL THEN '000'
    WHEN m IN ('036','059','063','102','203','556','692','790','821','823','830','831','878','879','884','890','893') THEN '000'
    ELSE m
  END
  FROM (SELECT substring(regexp_replace(coalesce(zip, ''), '^\s+|\s+$', '', 'g') FROM '^([0-9]{3})[0-9]{2}(?:-?[0-9]{4})?$') AS m) s
$$;

-- Completed years from dob to at_date (a 29 February birthday is reached on 1 March in common
-- years); NULL when at_date lies before birth.
CREATE OR REPLACE FUNCTION dentate_age_years(dob date, at_date date) RETURNS integer
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT CASE WHEN y < 0 THEN NULL ELSE y END
  FROM (SELECT (extract(year FROM at_date)::int - extract(year FROM dob)::int
    - CASE WHEN (extract(month FROM at_date)::int, extract(day FROM at_date)::int)
              < (extract(month FROM dob)::int, extract(day FROM dob)::int) THEN 1 ELSE 0 END) AS y) s
$$;

-- Age as text, with every age over 89 in one category '90+'.
CREATE OR REPLACE FUNCTION dentate_age_category(dob date, at_date date) RETURNS text
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT CASE WHEN a IS NULL THEN NULL WHEN a > 89 THEN '90+' ELSE a::text END
  FROM (SELECT dentate_age_years(dob, at_date) AS a) s
$$;

-- Year of birth, withheld (NULL) when the patient is over 89 at enrolment or at the export date:
-- the year alone would then reveal an age over 89.
CREATE OR REPLACE FUNCTION dentate_birth_year(dob date, enrolled_on date, as_of date) RETURNS integer
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT CASE
    WHEN coalesce(dentate_age_years(dob, enrolled_on), 0) > 89 THEN NULL
    WHEN as_of IS NOT NULL AND coalesce(dentate_age_years(dob, as_of), 0) > 89 THEN NULL
    ELSE extract(year FROM dob)::int
  END
$$;

-- Whole days from the anchor (enrolment) to the date; negative before the anchor.
CREATE OR REPLACE FUNCTION dentate_day_offset(d date, anchor date) RETURNS integer
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT d - anchor
$$;

CREATE OR REPLACE FUNCTION dentate_year_only(d date) RETURNS integer
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT extract(year FROM d)::int
$$;
