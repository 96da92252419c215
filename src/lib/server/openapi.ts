// The v1 API's OpenAPI document, from the zod schemas and error codes the handlers use.
import { z } from 'zod';
import { apiErrorSchema, diagnoseRequestSchema, diagnoseResponseSchema } from '../api/schema';
import { ERROR_CODES, ERROR_STATUS, type ApiErrorCode } from '../api/error-codes';
import { calculatorNames, calculatorResultSchema, calculators } from '../calculators';
import {
	appendEventResponseSchema,
	appendEventSchema,
	caseDetailSchema,
	caseListSchema,
	createCaseSchema,
	eventListSchema,
	eventsQuerySchema,
	listCasesQuerySchema,
	takeCaseSchema
} from '../api/cases-schema';

const schema = (s: z.ZodType, io: 'input' | 'output') =>
	z.toJSONSchema(s, { target: 'draft-2020-12', io, unrepresentable: 'any' });

/** Error answers by contract code; each is listed under the code's status from the one list. */
function errorResponses(descriptions: Partial<Record<ApiErrorCode, string>>) {
	return Object.fromEntries(
		ERROR_CODES.filter((code) => descriptions[code] !== undefined).map((code) => [
			String(ERROR_STATUS[code]),
			{
				description: `\`${code}\`: ${descriptions[code]}`,
				content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
			}
		])
	);
}

/** What every v1 operation may answer besides its own errors. */
const COMMON_ERRORS = {
	unauthenticated: 'No, unknown or revoked key, and no session',
	method_not_allowed: 'The path exists but not for this method; see Allow',
	rate_limited: 'Over the per-key or per-IP limit; see Retry-After',
	internal_error: 'A bug: the answer carries the request id'
} as const;

const BODY_ERRORS = {
	invalid_request: 'Not JSON, fails the schema, or a value out of range',
	unsupported_media_type: 'Body not sent as application/json'
} as const;

let document: Record<string, unknown> | undefined;

/** 'drain-and-fill' → 'DrainAndFillInput': component names may not hold every path character. */
const calculatorInputName = (name: string) =>
	name.replace(/(^|-)([a-z])/g, (_, _dash: string, letter: string) => letter.toUpperCase()) +
	'Input';

/** One path per calculator, so each request body has its own schema instead of a union. */
function describeCalculatorPaths(): Record<string, unknown> {
	return Object.fromEntries(
		calculatorNames.map((name) => [
			`/api/v1/calculators/${name}`,
			{
				post: {
					operationId: `calculate_${name.replaceAll('-', '_')}`,
					summary: calculators[name].title,
					description: calculators[name].description,
					tags: ['calculators'],
					requestBody: {
						required: true,
						content: {
							'application/json': {
								schema: { $ref: `#/components/schemas/${calculatorInputName(name)}` }
							}
						}
					},
					responses: {
						'200': {
							description: 'Every number with its unit, the basis, accuracy, warnings and cautions',
							content: {
								'application/json': { schema: { $ref: '#/components/schemas/CalculatorResult' } }
							}
						},
						...errorResponses({
							...COMMON_ERRORS,
							...BODY_ERRORS,
							invalid_request:
								'Not JSON, fails the schema, or a value the calculator cannot answer',
							too_large: 'Body over 16 KiB'
						})
					}
				}
			}
		])
	);
}

function describeCalculatorInputs(): Record<string, unknown> {
	return Object.fromEntries(
		calculatorNames.map((name) => [
			calculatorInputName(name),
			schema(calculators[name].inputSchema, 'input')
		])
	);
}

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const jsonBody = (name: string, required = true) => ({
	required,
	content: { 'application/json': { schema: ref(name) } }
});
const jsonAnswer = (description: string, name: string) => ({
	description,
	content: { 'application/json': { schema: ref(name) } }
});

/** Query parameters from a zod object schema, each with its own description. */
function queryParameters(s: z.ZodType) {
	const json = schema(s, 'input') as {
		properties: Record<string, { description?: string }>;
		required?: string[];
	};
	return Object.entries(json.properties).map(([name, property]) => ({
		name,
		in: 'query',
		required: json.required?.includes(name) ?? false,
		description: property.description,
		schema: property
	}));
}

const caseIdParameter = {
	name: 'id',
	in: 'path',
	required: true,
	schema: { type: 'string' },
	description: 'The case id.'
};

/** Errors every case endpoint shares. */
const caseErrors = {
	...COMMON_ERRORS,
	unauthenticated: 'No session (API keys may not read or change cases)',
	forbidden: 'The role may not do this, or an API key was sent',
	rate_limited: 'Over the per-user or per-IP limit; see Retry-After'
} as const;
const notFound = 'No such case in the caller’s shop (also for another shop’s ids)';

/**
 * The case API's schemas as components: the definitions zod puts under each schema's own `$defs`
 * (every schema with an id) become components of their own, referred to as
 * `#/components/schemas/…`, which resolves from the document's root where `#/$defs/…` does not.
 * An id whose input and output shapes differ gets an `Input` twin.
 */
function caseComponents(): Record<string, unknown> {
	const entries: [string, z.ZodType, 'input' | 'output'][] = [
		['CreateCase', createCaseSchema, 'input'],
		['AppendEvent', appendEventSchema, 'input'],
		['TakeCase', takeCaseSchema, 'input'],
		['CaseDetail', caseDetailSchema, 'output'],
		['CaseList', caseListSchema, 'output'],
		['CaseEventList', eventListSchema, 'output'],
		['AppendEventResponse', appendEventResponseSchema, 'output']
	];
	const components: Record<string, unknown> = {};
	for (const [, s, io] of entries) {
		const { $defs = {} } = schema(s, io) as { $defs?: Record<string, unknown> };
		const names = Object.fromEntries(
			Object.entries($defs).map(([id, def]) => {
				const text = JSON.stringify(def);
				const taken = components[id] !== undefined && JSON.stringify(components[id]) !== text;
				return [id, taken && io === 'input' ? `${id}Input` : id];
			})
		);
		for (const [id, def] of Object.entries($defs)) {
			const text = JSON.stringify(def).replace(
				/"#\/\$defs\/([^"]+)"/g,
				(_, ref: string) => `"#/components/schemas/${names[ref] ?? ref}"`
			);
			components[names[id]] ??= JSON.parse(text);
		}
	}
	return components;
}

function describeCasePaths(): Record<string, unknown> {
	const tags = ['cases'];
	return {
		'/api/v1/cases': {
			get: {
				operationId: 'listCases',
				summary: 'List the shop’s cases, newest first, with filters and a cursor',
				tags,
				parameters: queryParameters(listCasesQuerySchema),
				responses: {
					'200': jsonAnswer('One page of cases and the cursor of the next', 'CaseList'),
					...errorResponses({
						...caseErrors,
						invalid_request: 'Unknown parameter, bad status or cursor'
					})
				}
			},
			post: {
				operationId: 'createCase',
				summary: 'Open a case on a vehicle (by id or described), scored with the published edition',
				tags,
				requestBody: jsonBody('CreateCase'),
				responses: {
					'201': jsonAnswer('The case as GET /api/v1/cases/{id} shows it', 'CaseDetail'),
					...errorResponses({
						...caseErrors,
						invalid_request: 'Fails the schema, bad VIN, unknown vehicle or observation',
						too_large: 'Body over 64 KiB',
						unsupported_media_type: 'Body not sent as application/json'
					})
				}
			}
		},
		'/api/v1/cases/{id}': {
			get: {
				operationId: 'getCase',
				summary: 'The case with its vehicle, answers, timeline and current diagnosis',
				tags,
				parameters: [caseIdParameter],
				responses: {
					'200': jsonAnswer('The case', 'CaseDetail'),
					...errorResponses({ ...caseErrors, not_found: notFound })
				}
			}
		},
		'/api/v1/cases/{id}/events': {
			get: {
				operationId: 'listCaseEvents',
				summary: 'The case’s events after a sequence number (for following a case)',
				tags,
				parameters: [caseIdParameter, ...queryParameters(eventsQuerySchema)],
				responses: {
					'200': jsonAnswer('Events in server order', 'CaseEventList'),
					...errorResponses({ ...caseErrors, not_found: notFound })
				}
			},
			post: {
				operationId: 'appendCaseEvent',
				summary: 'Append one event to an open case and get the new ranking',
				tags,
				parameters: [caseIdParameter],
				requestBody: jsonBody('AppendEvent'),
				responses: {
					'201': jsonAnswer('The stored event and the diagnosis after it', 'AppendEventResponse'),
					'200': jsonAnswer(
						'A replayed event id: the stored event, nothing added',
						'AppendEventResponse'
					),
					...errorResponses({
						...caseErrors,
						invalid_request: 'Fails the schema, unknown observation or test, wrong value',
						not_found: notFound,
						conflict: 'The case is not open, or the edition to rescore on is not the newest',
						too_large: 'Body over 16 KiB',
						unsupported_media_type: 'Body not sent as application/json'
					})
				}
			}
		},
		'/api/v1/cases/{id}/take': {
			post: {
				operationId: 'takeCase',
				summary: 'Take a waiting case: it opens, assigned to the caller',
				tags,
				parameters: [caseIdParameter],
				requestBody: jsonBody('TakeCase', false),
				responses: {
					'200': jsonAnswer('The case, now open', 'CaseDetail'),
					...errorResponses({
						...caseErrors,
						not_found: notFound,
						conflict: 'The case is not waiting'
					})
				}
			}
		}
	};
}

/**
 * OpenAPI 3.1 for the v1 API, generated from the same zod schemas that validate requests, so the
 * published contract cannot drift from the code.
 */
export function getOpenApiDocument(): Record<string, unknown> {
	document ??= {
		openapi: '3.1.0',
		info: {
			title: 'Causeway API',
			version: '1.0.0',
			description:
				'Ranks the likely causes of engine overheating and coolant loss from observations, ' +
				'with the reasons, the next most useful questions and the confirming tests to run.'
		},
		servers: [{ url: '/' }],
		security: [{ apiKey: [] }, { session: [] }],
		paths: {
			'/api/v1/diagnose': {
				post: {
					operationId: 'diagnose',
					summary: 'Rank causes for a set of observations',
					requestBody: {
						required: true,
						content: {
							'application/json': { schema: { $ref: '#/components/schemas/DiagnoseRequest' } }
						}
					},
					responses: {
						'200': {
							description: 'Ranked causes, next questions and the confirming test plan',
							content: {
								'application/json': { schema: { $ref: '#/components/schemas/DiagnoseResponse' } }
							}
						},
						...errorResponses({
							...COMMON_ERRORS,
							...BODY_ERRORS,
							invalid_request: 'Not JSON, fails the schema, unknown observation, bad value or VIN',
							forbidden: 'Signed in, but the role may not do this (saveAsCase needs cases:work)',
							too_large: 'Body over 64 KiB'
						})
					}
				}
			},
			'/api/v1/calculators': {
				get: {
					operationId: 'listCalculators',
					summary: 'List the service calculators with their input schemas',
					tags: ['calculators'],
					responses: {
						'200': {
							description: '{ calculators: [{ name, title, description, inputSchema }] }'
						},
						...errorResponses(COMMON_ERRORS)
					}
				}
			},
			...describeCalculatorPaths(),
			...describeCasePaths(),
			'/api/health': {
				get: {
					operationId: 'health',
					summary: 'Liveness with the database reachable',
					security: [],
					responses: { '200': { description: '{ "ok": true }' } }
				}
			}
		},
		components: {
			securitySchemes: {
				apiKey: { type: 'http', scheme: 'bearer', description: 'A shop API key (cw_…)' },
				session: { type: 'apiKey', in: 'cookie', name: 'causeway_session' }
			},
			schemas: {
				DiagnoseRequest: schema(diagnoseRequestSchema, 'input'),
				DiagnoseResponse: schema(diagnoseResponseSchema, 'output'),
				Error: schema(apiErrorSchema, 'output'),
				CalculatorResult: schema(calculatorResultSchema, 'output'),
				...describeCalculatorInputs(),
				...caseComponents()
			}
		}
	};
	return document;
}
