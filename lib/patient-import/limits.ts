// Limits of one patient import. The file is read whole on both sides, so its size bounds the
// memory an import takes; the row count bounds the time (npm run bench imports the maximum).

/** Largest file accepted, in bytes of UTF-8 text. */
export const MAX_FILE_BYTES = 8 * 1024 * 1024;
/** Most patient rows (CSV lines after the header, or Patient entries of a bundle) in one file. */
export const MAX_ROWS = 10_000;
/** Longest cell of any column, mapped or not; the fields' own limits are shorter. */
export const MAX_CELL_CHARS = 1_000;
/** Most columns in a CSV file. */
export const MAX_COLUMNS = 100;
/** Rows shown in the preview. */
export const PREVIEW_ROWS = 10;
/** Problems listed in one report; the count of the rest is given. */
export const MAX_REPORTED_PROBLEMS = 5_000;

export const megabytes = (bytes: number) => `${Math.round((bytes / 1024 / 1024) * 10) / 10} MB`;

/** The request that carries a file as a JSON string: escaping can make it up to about twice its size. */
export const IMPORT_BODY_LIMIT = {
  bytes: 2 * MAX_FILE_BYTES + 64 * 1024,
  message: `The file is too large: at most ${megabytes(MAX_FILE_BYTES)} can be imported at once. Split it into smaller files.`,
};
