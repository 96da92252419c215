// The diagnosis API contract in zod: the request a client sends and the answer it gets.
import { z } from 'zod';
import { ERROR_CODES } from './error-codes';
import { validateVin } from '../vehicle/vin';

// Schemas of POST /api/v1/diagnose (contract v1). The OpenAPI document is generated from these
// with z.toJSONSchema, so every field carries its description here and nowhere else.

export const MAX_COMPLAINT_CHARS = 2000;

export const observationValueSchema = z
	.union([z.boolean(), z.string(), z.number(), z.null()])
	.meta({
		description:
			'Answer: true/false for a yes/no observation, one of its values for a choice, a number in its unit; null means not known (the same as leaving the key out).'
	});

export const vinSchema = z
	.string()
	// trim/toUpperCase (not transform) keep the schema representable in JSON Schema.
	.trim()
	.toUpperCase()
	.superRefine((vin, ctx) => {
		const check = validateVin(vin);
		if (!check.ok) ctx.addIssue({ code: 'custom', message: check.reason });
	})
	.meta({
		description:
			'Vehicle identification number, 17 characters; the check digit (9th character) must be right. Case and surrounding spaces are ignored.',
		example: '1M8GDM9AXKP042788'
	});

export const vehicleSchema = z
	.strictObject({
		year: z.number().int().min(1900).max(2100).optional().meta({ description: 'Model year.' }),
		make: z.string().trim().min(1).max(100).optional(),
		model: z.string().trim().min(1).max(100).optional(),
		engine: z
			.string()
			.trim()
			.min(1)
			.max(100)
			.optional()
			.meta({ description: 'Engine code or size.' }),
		odometerKm: z
			.number()
			.min(0)
			.max(10_000_000)
			.optional()
			.meta({ description: 'Odometer reading in kilometres.' }),
		vin: vinSchema.optional()
	})
	.meta({ description: 'The vehicle, all fields optional.' });

/** Answers by observation key. A key named like an Object.prototype member ("__proto__",
 * "constructor", "toString") is refused here with its path, as any unknown key is later: a record
 * cannot hold "__proto__" as data (it would be dropped), and no key may read an inherited value. */
const observationsSchema = z.preprocess(
	(input, ctx) => {
		if (typeof input !== 'object' || input === null) return input;
		for (const key of Object.keys(input)) {
			if (key === '__proto__' || key in Object.prototype) {
				ctx.issues.push({
					code: 'custom',
					input,
					path: [key],
					message: `unknown observation ${JSON.stringify(key)}`
				});
			}
		}
		return input;
	},
	z.record(z.string().min(1).max(100), observationValueSchema).default({})
);

export const diagnoseRequestSchema = z
	.strictObject({
		observations: observationsSchema.meta({
			description: 'Answers by observation key (keys and values from the rulebook vocabulary).',
			example: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false }
		}),
		unknown: z.array(z.string().min(1).max(100)).max(500).default([]).meta({
			description:
				'Observation keys that were asked but could not be answered: no evidence, and left out of nextQuestions.'
		}),
		complaint: z
			.string()
			.max(MAX_COMPLAINT_CHARS)
			.optional()
			.meta({
				description: `Customer complaint in free text (at most ${MAX_COMPLAINT_CHARS} characters); phrases are matched to observations, and an explicit observation always wins over a matched one.`
			}),
		vehicle: vehicleSchema.optional(),
		saveAsCase: z
			.boolean()
			.default(false)
			.meta({ description: 'When true, the request also opens a case in the shop.' })
	})
	.meta({ id: 'DiagnoseRequest', description: 'Observations to rank causes for.' });

const bandSchema = z
	.enum(['likely', 'possible', 'unlikely'])
	.meta({ description: 'From the thresholds the rulebook sets.' });

export const evidenceSchema = z
	.object({
		rule: z.string().meta({ description: 'Key of the rule that fired.' }),
		lr: z.number().positive().meta({
			description:
				'Likelihood ratio of the rule: above 1 supports the cause, below 1 argues against it.'
		}),
		because: z.string().meta({ description: 'The rule’s rationale.' }),
		source: z.string().optional().meta({
			description: 'Where the rule’s reasoning was published, or "common practice, no source".'
		})
	})
	.meta({ id: 'Evidence' });

export const rankedCauseSchema = z
	.object({
		key: z.string(),
		name: z.string(),
		probability: z.number().min(0).max(1),
		band: bandSchema,
		evidence: z.array(evidenceSchema).meta({ description: 'Fired rules, strongest first.' })
	})
	.meta({ id: 'RankedCause' });

export const nextQuestionSchema = z
	.object({
		key: z.string(),
		prompt: z.string(),
		expectedGain: z.number().meta({
			description:
				'Expected reduction, in bits, of the summed uncertainty (binary entropy) of the causes if this is answered.'
		}),
		kind: z.enum(['boolean', 'enum', 'number']).optional(),
		group: z.enum(['vehicle_history', 'symptom', 'inspection', 'test_result']).optional(),
		help: z.string().optional(),
		cautions: z.array(z.string()).optional(),
		values: z.array(z.string()).optional().meta({ description: 'Choices of an enum observation.' }),
		valueLabels: z.record(z.string(), z.string()).optional(),
		unit: z.string().optional(),
		min: z.number().optional(),
		max: z.number().optional(),
		bins: z
			.array(z.object({ value: z.number(), label: z.string(), frequency: z.number() }))
			.optional()
			.meta({ description: 'Typical answers of a number observation.' }),
		lowValue: z.boolean().optional().meta({
			description:
				'True when asking is not worth its time: under 0.05 bits, or less information per minute than the best test.'
		})
	})
	.meta({ id: 'NextQuestion' });

export const adviceSchema = z
	.object({
		stop: z.boolean().meta({
			description: 'True when no question left is worth asking: do bestTest next.'
		}),
		reason: z.string(),
		bestTest: z
			.string()
			.nullable()
			.meta({ description: 'Key of the first test of the plan, or null when none is left.' })
	})
	.meta({ id: 'Advice' });

export const plannedTestSchema = z
	.object({
		key: z.string(),
		name: z.string(),
		minutes: z.number().positive(),
		targets: z.array(z.string()).meta({ description: 'Causes the test can confirm or clear.' }),
		priority: z.number().int().min(1).meta({ description: '1 = do first.' }),
		cautions: z.array(z.string()),
		equipment: z.array(z.string()).optional(),
		steps: z.array(z.string()).optional(),
		sets: z.string().optional().meta({ description: 'Observation the test’s result answers.' }),
		score: z.number().optional().meta({
			description:
				'Expected information of the result in bits per minute of testing; tests are ordered by it.'
		})
	})
	.meta({ id: 'PlannedTest' });

export const complaintMatchSchema = z
	.object({
		key: z.string(),
		value: z.union([z.boolean(), z.string(), z.number()]),
		from: z.string().meta({ description: 'The part of the complaint that gave the match.' }),
		score: z.number().min(0).max(1).meta({ description: '1 = the rulebook phrase exactly.' })
	})
	.meta({ id: 'ComplaintMatch' });

export const diagnoseResponseSchema = z
	.object({
		rulebook: z.object({
			edition: z.number().int().min(1),
			publishedAt: z.string().nullable().meta({ description: 'ISO 8601 time of publication.' })
		}),
		causes: z
			.array(rankedCauseSchema)
			.meta({ description: 'Every cause, highest probability first; ties by key.' }),
		nextQuestions: z.array(nextQuestionSchema).meta({
			description:
				'Unanswered observations, most informative first: the best ten, or all that remain if fewer.'
		}),
		tests: z.array(plannedTestSchema).meta({
			description:
				'Confirming tests not yet done, in the order to do them (step lists are in the rulebook).'
		}),
		matched: z.array(complaintMatchSchema),
		cautions: z.array(z.string()),
		advice: adviceSchema.optional().meta({
			description: 'Whether questions are still worth asking, or the best test is next.'
		}),
		caseId: z
			.string()
			.nullable()
			.meta({ description: 'Id of the case opened when saveAsCase was true, else null.' })
	})
	.meta({ id: 'DiagnoseResponse' });

export const apiIssueSchema = z.object({
	path: z.string().meta({ description: 'Where in the request, e.g. observations.temp_gauge.' }),
	message: z.string()
});

export const apiErrorSchema = z
	.object({
		error: z.object({
			code: z.enum(ERROR_CODES),
			message: z.string(),
			issues: z.array(apiIssueSchema).optional(),
			requestId: z.string().optional().meta({ description: 'Quote it when reporting a problem.' })
		})
	})
	.meta({ id: 'Error' });

export type DiagnoseRequest = z.infer<typeof diagnoseRequestSchema>;
export type DiagnoseRequestInput = z.input<typeof diagnoseRequestSchema>;
export type DiagnoseResponse = z.infer<typeof diagnoseResponseSchema>;
export type ApiError = z.infer<typeof apiErrorSchema>;
