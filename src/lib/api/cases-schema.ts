// Schemas of the case API (/api/v1/cases…): requests are parsed with them and the OpenAPI
// document is generated from them, so each field is described here and nowhere else.
import { z } from 'zod';
import {
	complaintMatchSchema,
	MAX_COMPLAINT_CHARS,
	nextQuestionSchema,
	observationValueSchema,
	plannedTestSchema,
	rankedCauseSchema,
	vinSchema
} from './schema';
import {
	CASE_SOURCES,
	CASE_STATUSES,
	CLIENT_EVENT_KINDS,
	EVENT_KINDS,
	ODOMETER_UNITS
} from '../cases/model';

export const MAX_NOTE_CHARS = 2000;
/** Above any road vehicle's odometer (long-haul trucks pass 2 million km); "from memory". */
export const MAX_ODOMETER = 3_000_000;

const observationKeySchema = z.string().min(1).max(100);
const answerValueSchema = z.union([z.boolean(), z.string().max(100), z.number()]);
const shortText = (max: number) => z.string().trim().min(1).max(max);

export const plateSchema = z
	.string()
	.trim()
	.toUpperCase()
	.regex(
		/^[A-Z0-9][A-Z0-9 -]{0,14}$/,
		'a plate or fleet number has 1–15 letters, digits, spaces or -'
	)
	.meta({ description: 'Registration plate or fleet number; stored upper case without spaces.' });

export const vehicleInputSchema = z
	.strictObject({
		vin: vinSchema.optional(),
		plate: plateSchema.optional(),
		year: z.number().int().min(1900).max(2100).optional().meta({ description: 'Model year.' }),
		make: shortText(100).optional(),
		model: shortText(100).optional(),
		engine: shortText(100).optional().meta({ description: 'Engine code or size.' })
	})
	.refine((v) => v.vin || v.plate || (v.make && v.model), {
		message: 'give a VIN, a plate or fleet number, or the make and model'
	})
	.meta({
		id: 'VehicleInput',
		description: 'A vehicle of the shop; with a VIN the shop’s existing vehicle is reused.'
	});

export const odometerSchema = z
	.strictObject({
		value: z.number().min(0).max(MAX_ODOMETER),
		unit: z.enum(ODOMETER_UNITS).meta({ description: 'As read off the dashboard; kept as given.' })
	})
	.meta({ id: 'Odometer' });

export const contactSchema = z
	.strictObject({
		name: shortText(120).optional(),
		phone: z
			.string()
			.trim()
			.regex(/^[+0-9 ()./-]{5,30}$/, 'a phone number has 5–30 digits, spaces or + ( ) . / -')
			.optional(),
		email: z.email().max(254).optional()
	})
	.meta({ id: 'Contact', description: 'The customer’s contact details.' });

export const createCaseSchema = z
	.strictObject({
		vehicleId: z.string().min(1).max(64).optional().meta({ description: 'A vehicle of the shop.' }),
		vehicle: vehicleInputSchema.optional(),
		odometer: odometerSchema.optional(),
		complaint: z.string().trim().min(1).max(MAX_COMPLAINT_CHARS).optional(),
		contact: contactSchema.optional(),
		observations: z.record(observationKeySchema, observationValueSchema).default({}).meta({
			description: 'Answers already known when the case opens (keys from the rulebook).'
		}),
		unknown: z.array(observationKeySchema).max(500).default([]),
		status: z.enum(['open', 'waiting']).default('open').meta({
			description: 'open: assigned to the caller at once; waiting: into the bay’s queue.'
		})
	})
	.refine((c) => Boolean(c.vehicleId) !== Boolean(c.vehicle), {
		message: 'give either vehicleId or vehicle',
		path: ['vehicle']
	})
	.meta({ id: 'CreateCase' });

const clientEventIdSchema = z
	.string()
	.regex(/^[A-Za-z0-9_-]{8,64}$/, 'an event id has 8–64 letters, digits, _ or - (a UUID will do)')
	.meta({
		description:
			'Made by the device before sending; a replay with the same id is answered with the stored event.'
	});

const testKeySchema = z.string().min(1).max(100);

/** One payload per client event kind; the server checks keys and values against the edition. */
export const eventPayloadSchemas = {
	answer_set: z.strictObject({ key: observationKeySchema, value: answerValueSchema }),
	answer_cleared: z.strictObject({ key: observationKeySchema }),
	not_sure: z.strictObject({ key: observationKeySchema }),
	complaint_match_accepted: z.strictObject({ key: observationKeySchema, value: answerValueSchema }),
	complaint_match_rejected: z.strictObject({ key: observationKeySchema, value: answerValueSchema }),
	test_step_ticked: z.strictObject({
		test: testKeySchema,
		step: z.number().int().min(0).max(99).meta({ description: 'Index of the step, from 0.' }),
		done: z.boolean()
	}),
	test_result_recorded: z.strictObject({ test: testKeySchema, value: answerValueSchema }),
	note: z.strictObject({ text: shortText(MAX_NOTE_CHARS) }),
	rescored: z.strictObject({
		toEdition: z.number().int().min(1).max(1_000_000).meta({
			description: 'Number of the shop’s newest published edition, which the case moves to.'
		})
	})
} as const satisfies Record<(typeof CLIENT_EVENT_KINDS)[number], z.ZodType>;

export const appendEventSchema = z
	.discriminatedUnion(
		'kind',
		CLIENT_EVENT_KINDS.map((kind) =>
			z.strictObject({
				id: clientEventIdSchema,
				kind: z.literal(kind),
				payload: eventPayloadSchemas[kind]
			})
		) as unknown as [z.ZodObject, ...z.ZodObject[]]
	)
	.meta({
		id: 'AppendEvent',
		description: 'One change to an open case.'
	}) as unknown as z.ZodType<AppendEvent>;

export type AppendEvent = {
	[K in (typeof CLIENT_EVENT_KINDS)[number]]: {
		id: string;
		kind: K;
		payload: z.infer<(typeof eventPayloadSchemas)[K]>;
	};
}[(typeof CLIENT_EVENT_KINDS)[number]];

export const takeCaseSchema = z
	.strictObject({ id: clientEventIdSchema.optional() })
	.meta({ id: 'TakeCase' });

const statusListSchema = z
	.string()
	.max(100)
	.transform((s) => s.split(',').map((part) => part.trim()))
	.pipe(z.array(z.enum(CASE_STATUSES)).min(1));

export const listCasesQuerySchema = z.strictObject({
	status: statusListSchema
		.optional()
		.meta({ description: 'One status or several, comma-separated.' }),
	assignee: z
		.string()
		.min(1)
		.max(64)
		.optional()
		.meta({ description: 'A user id, "me", or "none" for cases nobody has taken.' }),
	q: z.string().trim().min(1).max(100).optional().meta({
		description: 'Words found in the VIN, the plate or the complaint (all words must appear).'
	}),
	limit: z.coerce.number().int().min(1).max(100).default(25),
	cursor: z.string().min(1).max(200).optional().meta({
		description: 'From the previous page’s nextCursor; newest cases first.'
	})
});

export const eventsQuerySchema = z.strictObject({
	after: z.coerce.number().int().min(0).max(1_000_000_000).default(0).meta({
		description: 'Only events with a higher sequence number (the last one a device has seen).'
	})
});

const personSchema = z.object({ id: z.string(), name: z.string() }).nullable();
const rankingSchema = z
	.array(z.object({ key: z.string(), probability: z.number().min(0).max(1) }))
	.meta({ id: 'Ranking', description: 'Cause keys and probabilities, best first.' });

export const vehicleSchema = z
	.object({
		id: z.string(),
		vin: z.string().nullable(),
		plate: z.string().nullable(),
		year: z.number().nullable(),
		make: z.string().nullable(),
		model: z.string().nullable(),
		engine: z.string().nullable()
	})
	.meta({ id: 'Vehicle' });

export const caseEventSchema = z
	.object({
		id: z.string().meta({ description: 'The client event id.' }),
		seq: z.number().int().min(1).meta({ description: 'Server order within the case.' }),
		kind: z.enum(EVENT_KINDS),
		payload: z.record(z.string(), z.unknown()),
		ranking: rankingSchema,
		edition: z.number().int().meta({ description: 'Edition number the ranking was scored with.' }),
		by: personSchema,
		at: z.string().meta({ description: 'ISO 8601, server time.' })
	})
	.meta({ id: 'CaseEvent' });

export const caseSummarySchema = z
	.object({
		id: z.string(),
		status: z.enum(CASE_STATUSES),
		source: z.enum(CASE_SOURCES),
		complaint: z.string().nullable(),
		vehicle: vehicleSchema.nullable(),
		assignee: personSchema,
		topCauses: rankingSchema,
		lastSeq: z.number().int(),
		createdAt: z.string(),
		updatedAt: z.string()
	})
	.meta({ id: 'CaseSummary' });

const diagnosisSchema = z.object({
	causes: z.array(rankedCauseSchema),
	nextQuestions: z.array(nextQuestionSchema),
	tests: z.array(plannedTestSchema),
	cautions: z.array(z.string())
});

const answerSchema = z.object({
	key: z.string(),
	value: answerValueSchema,
	seq: z.number().int(),
	source: z.enum(['answer', 'intake', 'complaint', 'test']),
	from: z
		.string()
		.optional()
		.meta({ description: 'The complaint’s words, for an accepted match.' }),
	test: z.string().optional()
});

export const caseDetailSchema = z
	.object({
		case: caseSummarySchema.extend({
			odometer: odometerSchema.nullable(),
			contact: contactSchema.nullable(),
			openedBy: personSchema,
			edition: z.object({ number: z.number().int(), publishedAt: z.string().nullable() }),
			newerEdition: z
				.object({ number: z.number().int() })
				.nullable()
				.meta({ description: 'A newer published edition the case may be rescored on.' })
		}),
		answers: z.array(answerSchema).meta({ description: 'Current answers, later wins.' }),
		notSure: z.array(z.string()),
		suggestions: z.array(complaintMatchSchema).meta({
			description: 'Complaint matches not yet accepted or rejected; they count once accepted.'
		}),
		ticks: z.record(z.string(), z.array(z.number().int())),
		timeline: z.array(caseEventSchema),
		diagnosis: diagnosisSchema
	})
	.meta({ id: 'CaseDetail' });

export const appendEventResponseSchema = z
	.object({
		event: caseEventSchema,
		replayed: z.boolean().meta({ description: 'true: the id was seen before; nothing was added.' }),
		diagnosis: diagnosisSchema
	})
	.meta({ id: 'AppendEventResponse' });

export const caseListSchema = z
	.object({ cases: z.array(caseSummarySchema), nextCursor: z.string().nullable() })
	.meta({ id: 'CaseList' });

export const eventListSchema = z
	.object({
		events: z.array(caseEventSchema),
		lastSeq: z.number().int(),
		status: z.enum(CASE_STATUSES)
	})
	.meta({ id: 'CaseEventList' });

export type CreateCase = z.infer<typeof createCaseSchema>;
export type VehicleInput = z.infer<typeof vehicleInputSchema>;
export type ListCasesQuery = z.infer<typeof listCasesQuerySchema>;
export type CaseEventView = z.infer<typeof caseEventSchema>;
export type CaseSummary = z.infer<typeof caseSummarySchema>;
export type CaseDetail = z.infer<typeof caseDetailSchema>;
