// Kept apart from sync.ts so the sync store, in every page's first script, does not load zod
// with the request schema only the server uses (issue 14).

/** The most events one POST /api/sync may carry. */
export const MAX_SYNC_EVENTS = 500
