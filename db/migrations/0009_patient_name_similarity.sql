-- Trigram similarity for the duplicate warning at registration: a close spelling of the family
-- name with the same date of birth at the same site (pg_trgm ships with PostgreSQL's contrib).
CREATE EXTENSION IF NOT EXISTS pg_trgm;
