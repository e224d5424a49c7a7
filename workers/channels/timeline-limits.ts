/** Limits of the timeline channel, shared with the app (no physics imports here). */

/** Most steps one timeline call accepts (a 1-minute day is 1440; a year of hours 8760). */
export const MAX_TIMELINE_STEPS = 10_000;
