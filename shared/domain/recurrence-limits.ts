/**
 * The recurrence limit on its own, so the booking schemas (on every signed-in page) can name it
 * without loading recurrence.ts and the date library it needs.
 */

/** The longest campaign a single request may create (two years of weekly sessions). */
export const MAX_WEEKLY_OCCURRENCES = 104;
