/**
 * Cores and boards change rarely, and every edit made in this app invalidates them: a minute
 * before asking the server again covers edits made elsewhere.
 */
export const RESOURCE_STALE_MS = 60_000;
