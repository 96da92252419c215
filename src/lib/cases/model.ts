// The case model's vocabulary (statuses, sources, event kinds), shared by the database schema,
// the API schemas, the server and the case page. Plain data, no I/O.

/**
 * A case waits in the bay's queue until a technician takes it, is worked while open, and then
 * moves through the repair and its verification to closed (the repair and recheck states are
 * filled in by the evidence-and-follow-up work).
 */
export const CASE_STATUSES = ['waiting', 'open', 'repaired', 'verifying', 'closed'] as const;
export type CaseStatus = (typeof CASE_STATUSES)[number];

/** Where a case came from: opened at the bay, saved through the API, or the hosted intake form. */
export const CASE_SOURCES = ['bay', 'api', 'intake-form'] as const;
export type CaseSource = (typeof CASE_SOURCES)[number];

export const ODOMETER_UNITS = ['km', 'mi'] as const;
export type OdometerUnit = (typeof ODOMETER_UNITS)[number];

/** Events a client may append to an open case (POST /api/v1/cases/{id}/events). */
export const CLIENT_EVENT_KINDS = [
	'answer_set',
	'answer_cleared',
	'not_sure',
	'complaint_match_accepted',
	'complaint_match_rejected',
	'test_step_ticked',
	'test_result_recorded',
	'note',
	'rescored'
] as const;

/** Events only the server writes: the case's opening and a technician taking it. Status changes
 * of the repair and verification work join this list as they land. */
export const SERVER_EVENT_KINDS = ['case_opened', 'case_taken'] as const;

export const EVENT_KINDS = [...SERVER_EVENT_KINDS, ...CLIENT_EVENT_KINDS] as const;
export type EventKind = (typeof EVENT_KINDS)[number];
export type ClientEventKind = (typeof CLIENT_EVENT_KINDS)[number];

/** One cause's probability after an event: the ranking is stored with every event. */
export type RankingEntry = { key: string; probability: number };

/** The customer's contact details from intake. */
export type CaseContact = { name?: string; phone?: string; email?: string };
