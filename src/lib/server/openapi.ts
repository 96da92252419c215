import { z } from 'zod';
import { apiErrorSchema, diagnoseRequestSchema, diagnoseResponseSchema } from '../api/schema';
import { ERROR_CODES, ERROR_STATUS, type ApiErrorCode } from '../api/error-codes';
import { calculatorNames, calculatorResultSchema, calculators } from '../calculators';

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
				...describeCalculatorInputs()
			}
		}
	};
	return document;
}
