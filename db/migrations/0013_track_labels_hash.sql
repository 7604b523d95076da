-- Track labels "T1", "T2"… read as TNM tumour categories; they become "#1", "#2"… (lib/domain/track-label.ts).
-- The number is kept, so the order of a patient's tracks and every reference to a track id stay the same.
UPDATE "lesion_tracks" SET "label" = '#' || substring("label" from 2) WHERE "label" ~ '^T[0-9]+$';
