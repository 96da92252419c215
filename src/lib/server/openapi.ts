import { z } from 'zod';
import { apiErrorSchema, diagnoseRequestSchema, diagnoseResponseSchema } from '../api/schema';
import { calculatorNames, calculatorResultSchema, calculators } from '../calculators';

const schema = (s: z.ZodType, io: 'input' | 'output') =>
	z.toJSONSchema(s, { target: 'draft-2020-12', io, unrepresentable: 'any' });

const errorResponse = (description: string) => ({
	description,
	content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
});

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
						'400': errorResponse(
							'Not JSON, fails the schema, or a value the calculator cannot answer'
						),
						'401': errorResponse('No, unknown or revoked key, and no session'),
						'413': errorResponse('Body over 16 KiB'),
						'415': errorResponse('Body not sent as application/json'),
						'429': errorResponse('Over the per-key or per-IP limit; see Retry-After')
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
						'400': errorResponse(
							'Not JSON, fails the schema, unknown observation, bad value or VIN'
						),
						'401': errorResponse('No, unknown or revoked key, and no session'),
						'403': errorResponse('Signed in, but the role may not do this'),
						'413': errorResponse('Body over 64 KiB'),
						'415': errorResponse('Body not sent as application/json'),
						'429': errorResponse('Over the per-key or per-IP limit; see Retry-After')
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
						'401': errorResponse('No, unknown or revoked key, and no session')
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
