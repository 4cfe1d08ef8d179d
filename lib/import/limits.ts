/** Largest accepted upload (the CSV bytes, or the whole multipart body). Above it: 413. */
export const MAX_IMPORT_BYTES = 64 * 1024 * 1024;
/** Errors listed in an answer; the total is always counted. */
export const MAX_LISTED_ERRORS = 200;
