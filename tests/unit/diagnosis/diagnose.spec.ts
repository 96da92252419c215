import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { makeSyntheticRulebook } from '../../support/synthetic-rulebook';
import { createDiagnoser, parseRulebook, validateObservations } from '../../../src/lib/diagnosis';
import {
	apiErrorSchema,
	diagnoseRequestSchema,
	diagnoseResponseSchema
} from '../../../src/lib/api/schema';
import { diagnose, makeCoolingRulebook, makeRandomRulebook, makeRulebook } from './factories';

describe('validateObservations', () => {
	const rulebook = makeCoolingRulebook();

	it('accepts valid answers and nulls', () => {
		expect(
			validateObservations(rulebook, {
				temp_gauge: 'high_at_idle',
				fan_runs_when_hot: false,
				loss_l_per_week: 0.5,
				cap_test: null
			})
		).toEqual([]);
	});

	it('reports unknown keys, wrong kinds, values not allowed and numbers out of range, by path', () => {
		const issues = validateObservations(
			rulebook,
			{
				temp_guage: 'normal',
				fan_runs_when_hot: 'yes',
				temp_gauge: 'boiling',
				loss_l_per_week: 80,
				coolant_level: 3
			},
			['cap_test', 'fan_sped', 7]
		);
		expect(issues).toEqual([
			{ path: 'observations.temp_guage', message: 'unknown observation "temp_guage"' },
			{ path: 'observations.fan_runs_when_hot', message: expect.stringContaining('not a boolean') },
			{
				path: 'observations.temp_gauge',
				message: expect.stringContaining('(normal, high_at_idle, high_at_speed, high_always)')
			},
			{ path: 'observations.loss_l_per_week', message: expect.stringContaining('outside') },
			{ path: 'observations.coolant_level', message: expect.stringContaining('not a string') },
			{ path: 'unknown[1]', message: 'unknown observation "fan_sped"' },
			{ path: 'unknown[2]', message: 'unknown observation 7' }
		]);
	});

	it('rejects numbers that are not finite', () => {
		for (const value of [Number.NaN, Number.POSITIVE_INFINITY]) {
			expect(validateObservations(rulebook, { loss_l_per_week: value })).toEqual([
				{
					path: 'observations.loss_l_per_week',
					message: expect.stringContaining('not a finite number')
				}
			]);
		}
	});

	it('does not mistake inherited object members for observations', () => {
		expect(
			validateObservations(rulebook, JSON.parse('{"constructor": true, "__proto__": 1}'))
		).toEqual([
			{ path: 'observations.constructor', message: 'unknown observation "constructor"' },
			{ path: 'observations.__proto__', message: 'unknown observation "__proto__"' }
		]);
	});
});

describe('createDiagnoser', () => {
	it('refuses a rulebook that fails the schema, naming the issue', () => {
		const rulebook = makeRulebook();
		rulebook.rules[0].lr = 1;
		expect(() => createDiagnoser(rulebook)).toThrow(/rules\[0\]\.lr: lr must not be 1/);
	});

	it('ignores answers to observations the rulebook does not have', async () => {
		const diagnoser = createDiagnoser(makeCoolingRulebook());
		const plain = await diagnose(diagnoser, { observations: { temp_gauge: 'high_at_idle' } });
		const extra = await diagnose(diagnoser, {
			observations: { temp_gauge: 'high_at_idle', constructor: true, no_such_key: 'x' }
		});
		expect(extra).toEqual(plain);
	});

	it('lists every cause, rounded to 4 decimals, with name, band and evidence', async () => {
		const rulebook = makeCoolingRulebook();
		const diagnosis = await diagnose(createDiagnoser(rulebook), {
			observations: { fan_runs_when_hot: false }
		});
		expect(diagnosis.causes.map((cause) => cause.key).sort()).toEqual(
			rulebook.causes.map((cause) => cause.key).sort()
		);
		for (const cause of diagnosis.causes) {
			expect(cause.probability).toBe(Math.round(cause.probability * 1e4) / 1e4);
		}
		expect(diagnosis.causes[0]).toEqual({
			key: 'cooling_fan_fault',
			name: 'Cooling fan not running',
			probability: 0.439, // 0.08/0.92 × 9 = 0.7826 odds → 0.43902…
			band: 'possible',
			evidence: [
				{
					rule: 'fan-off-when-hot',
					lr: 9,
					because: 'Fixture rule fan-off-when-hot.',
					source: 'common practice, no source'
				}
			]
		});
	});
});

describe('makeSyntheticRulebook', () => {
	it('makes a valid rulebook ten times larger with the same shape', () => {
		const base = makeCoolingRulebook();
		const synthetic = makeSyntheticRulebook(base, 10);
		const parsed = parseRulebook(synthetic);
		expect(parsed.ok, JSON.stringify(!parsed.ok && parsed.issues.slice(0, 3))).toBe(true);
		expect(synthetic.causes).toHaveLength(base.causes.length * 10);
		expect(synthetic.observations).toHaveLength(base.observations.length * 10);
		expect(synthetic.rules).toHaveLength(base.rules.length * 10);
		expect(synthetic.tests).toHaveLength(base.tests.length * 10);
	});

	it('makes each copy behave like the base on its own observations', async () => {
		const base = makeCoolingRulebook();
		const baseDiagnosis = await createDiagnoser(base).analyse({
			observations: { fan_runs_when_hot: false }
		});
		const synthetic = await createDiagnoser(makeSyntheticRulebook(base, 3)).analyse({
			observations: { fan_runs_when_hot_x2: false }
		});
		const fanCopy = synthetic.causes.find((cause) => cause.key === 'cooling_fan_fault_x2');
		const fanBase = baseDiagnosis.causes.find((cause) => cause.key === 'cooling_fan_fault');
		expect(fanCopy?.probability).toBe(fanBase?.probability);
		expect(fanCopy?.evidence.map((item) => item.rule)).toEqual(['fan-off-when-hot-x2']);
	});
});

describe('API schemas', () => {
	it('accepts the contract’s example request and fills the defaults', () => {
		const parsed = diagnoseRequestSchema.parse({
			observations: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false },
			unknown: ['fan_circuit_test'],
			complaint: 'gets hot sitting in traffic, fine on the motorway',
			vehicle: {
				year: 2014,
				make: 'Invented',
				model: 'Van',
				engine: '2.0 diesel',
				odometerKm: 182000
			}
		});
		expect(parsed.saveAsCase).toBe(false);
		expect(diagnoseRequestSchema.parse({}).observations).toEqual({});
	});

	it('rejects a bad VIN, a long complaint, an unexpected field and non-finite numbers with paths', () => {
		const cases: [unknown, string][] = [
			[{ vehicle: { vin: '1M8GDM9A1KP042788' } }, 'vehicle.vin'],
			[{ complaint: 'x'.repeat(2001) }, 'complaint'],
			[{ observation: { temp_gauge: 'normal' } }, ''],
			[
				{ observations: { loss_l_per_week: Number.POSITIVE_INFINITY } },
				'observations.loss_l_per_week'
			],
			[{ observations: { temp_gauge: ['normal'] } }, 'observations.temp_gauge'],
			[{ saveAsCase: 'yes' }, 'saveAsCase']
		];
		for (const [body, path] of cases) {
			const result = diagnoseRequestSchema.safeParse(body);
			expect(result.success, JSON.stringify(body).slice(0, 80)).toBe(false);
			expect(result.error?.issues.map((issue) => issue.path.join('.'))).toContain(path);
		}
	});

	it('describes a real diagnosis as a valid response', async () => {
		const diagnoser = createDiagnoser(makeRandomRulebook(3));
		const diagnosis = await diagnose(diagnoser, { observations: {}, complaint: 'nothing to see' });
		const response = { rulebook: { edition: 1, publishedAt: null }, ...diagnosis, caseId: null };
		expect(diagnoseResponseSchema.safeParse(response).success).toBe(true);
		expect(
			apiErrorSchema.safeParse({
				error: {
					code: 'invalid_request',
					message: 'Request does not fit the schema.',
					issues: [{ path: 'observations.temp_gauge', message: '"hot" is not one of …' }]
				}
			}).success
		).toBe(true);
		expect(apiErrorSchema.safeParse({ error: { code: 'oops', message: 'x' } }).success).toBe(false);
	});

	it('converts to JSON Schema for the OpenAPI document, descriptions included', () => {
		const request = z.toJSONSchema(diagnoseRequestSchema, { io: 'input' }) as {
			$defs: Record<
				string,
				{ properties: Record<string, { description?: string; maxLength?: number }> }
			>;
		};
		const properties = request.$defs.DiagnoseRequest.properties;
		expect(properties.complaint.maxLength).toBe(2000);
		expect(properties.observations.description).toMatch(/observation key/);
		const response = JSON.stringify(z.toJSONSchema(diagnoseResponseSchema));
		expect(response).toContain('expectedGain');
		expect(JSON.stringify(z.toJSONSchema(apiErrorSchema))).toContain('rate_limited');
	});
});
