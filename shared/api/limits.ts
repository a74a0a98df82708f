/** Sizes the server accepts; the client checks them before it uploads, so a user hears the limit at once. */
export const MAX_TRACE_BYTES = 50 * 1024 * 1024;
/** A CI report posted to `POST /api/runs/report` (JUnit XML or `parley run --json`). */
export const MAX_REPORT_BYTES = 20 * 1024 * 1024;
export const MAX_REPORT_CASES = 20_000;
/** A zip of vectors posted to `POST /api/vectors/import`, and what it may hold once inflated. */
export const MAX_IMPORT_ZIP_BYTES = 10 * 1024 * 1024;
export const MAX_IMPORT_FILES = 5_000;
export const MAX_IMPORT_BYTES = 20 * 1024 * 1024;

/** Most runs (placements) one fault sweep may have on the server; a larger campaign samples with `max` or runs in CI with `parley sweep --shard`. */
export const MAX_SERVER_SWEEP_RUNS = 20_000;
/** Broken runs of a server sweep kept as results (each with its evidence); the count says how many there were. */
export const MAX_SWEEP_BROKEN_STORED = 200;
/** Broken runs of a server sweep shrunk to a `negotiation` vector (shrinking simulates up to 200 times each). */
export const MAX_SWEEP_SHRUNK = 10;
