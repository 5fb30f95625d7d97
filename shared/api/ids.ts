/**
 * Patterns shared by the client and the server (no Node or DOM imports).
 *
 * Ids in URLs and queries: decimal digits, no sign, no leading zero, no hex, no exponent, no
 * spaces, at most 16 digits (the server also checks it is a safe integer). `0x1`, `1e3`, ` 1`
 * and `01` are not ids, so they are simply not found.
 */
export const ID_PATTERN = /^[1-9]\d{0,15}$/;

/** Rehearsal and k-sweep seeds: 1-64 letters, digits, '-' and '_'. */
export const SEED_PATTERN = /^[A-Za-z0-9_-]{1,64}$/;
