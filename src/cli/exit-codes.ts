/**
 * Exit codes of every CLI command (the contract of docs/references.md §13):
 * 0 success, 1 the computation or run failed, 2 bad arguments (or, for
 * `batch`, a wrong input header), 3 finished but some rows failed (`batch`)
 * or nothing was computed (`oval`, `sweep`: every boundary missing, each with its reason),
 * 130 / 143 `batch` stopped by SIGINT / SIGTERM (the shell's 128 + signal number).
 */
export const EXIT_OK = 0;
export const EXIT_FAILURE = 1;
export const EXIT_USAGE = 2;
export const EXIT_ROWS_FAILED = 3;
export const EXIT_SIGINT = 130;
export const EXIT_SIGTERM = 143;
