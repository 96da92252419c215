import { describe, expect, it } from 'vitest';
import { createDiagnoser } from '../../../src/lib/diagnosis';
import { makeCoolingRulebook } from './factories';

// The phrases are the cooling fixture's (invented); the complaints are what customers say.
const diagnoser = createDiagnoser(makeCoolingRulebook());
const match = (complaint: string) => diagnoser.matchComplaint(complaint);

describe('complaint matching', () => {
	it('reads "gets hot sitting in traffic, fine on the motorway" as hot at idle, and nothing about speed', () => {
		const matched = match('gets hot sitting in traffic, fine on the motorway');
		expect(matched).toEqual([
			{
				key: 'temp_gauge',
				value: 'high_at_idle',
				from: 'hot sitting in traffic',
				score: expect.any(Number)
			}
		]);
		expect(matched[0].score).toBeGreaterThan(0.8);
		expect(matched[0].score).toBeLessThan(1);
	});

	it('reads "sweet smell inside the car and the windows fog up" as a cabin smell and a fogged screen', () => {
		expect(match('sweet smell inside the car and the windows fog up')).toEqual([
			{ key: 'sweet_smell', value: 'cabin', from: 'sweet smell inside', score: 1 },
			{ key: 'windscreen_film', value: true, from: 'windows fog up', score: 1 }
		]);
	});

	it('reads "losing water but no leaks on the drive" as a falling level with no drips', () => {
		expect(match('losing water but no leaks on the drive')).toEqual([
			{ key: 'level_drops_between_checks', value: true, from: 'losing water', score: 1 },
			{ key: 'puddle_under_vehicle', value: false, from: 'no leaks on the drive', score: 1 }
		]);
	});

	it('reads "white smoke out the back all the time" as persistent white smoke', () => {
		const matched = match('white smoke out the back all the time');
		expect(matched).toHaveLength(1);
		expect(matched[0]).toMatchObject({ key: 'exhaust_smoke', value: 'white_persistent', score: 1 });
	});

	it('turns a negated yes/no phrase into the opposite answer, and keeps a phrase’s own negation', () => {
		expect(match("the fan doesn't come on")).toMatchObject([
			{ key: 'fan_runs_when_hot', value: false }
		]);
		expect(match('fan never comes on')).toMatchObject([{ key: 'fan_runs_when_hot', value: false }]);
		expect(match('the fan kicks in fine')).toMatchObject([
			{ key: 'fan_runs_when_hot', value: true }
		]);
		expect(match('without a puddle under the car')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: false }
		]);
		expect(match('isnt losing water')).toMatchObject([
			{ key: 'level_drops_between_checks', value: false }
		]);
	});

	it('skips a negated phrase of a choice observation and uses the one that is not negated', () => {
		expect(match('not hot in traffic, overheats on the motorway')).toEqual([
			{ key: 'temp_gauge', value: 'high_at_speed', from: 'overheats on the motorway', score: 1 }
		]);
		expect(match('never hot in traffic')).toEqual([]);
	});

	it('keeps a negation inside its own clause', () => {
		// "no" belongs to the smoke clause, not to the leak clause after "and".
		expect(match('no smoke and it leaks on the drive')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: true }
		]);
	});

	it('tolerates small misspellings and other word endings', () => {
		expect(match('sweet smel insde')).toMatchObject([{ key: 'sweet_smell', value: 'cabin' }]);
		expect(match('it overheated when idling')).toMatchObject([
			{ key: 'temp_gauge', value: 'high_at_idle' }
		]);
	});

	it('never reads a word the phrases use as a misspelling of another', () => {
		// "dripping" is a phrase word itself, so it is not a typo of "dropping".
		expect(match('the level is dripping')).toEqual([]);
		expect(match('the level keeps droping')).toMatchObject([
			{ key: 'level_drops_between_checks', value: true }
		]);
	});

	it('matches nothing in a complaint about something else', () => {
		expect(match('the radio crackles and the wipers squeak')).toEqual([]);
		expect(match('')).toEqual([]);
		expect(match('!!! ... ,,,')).toEqual([]);
	});

	it('keeps the best match per observation', () => {
		const matched = match('keeps losing coolant, losing water');
		expect(matched).toHaveLength(1);
		expect(matched[0]).toMatchObject({ key: 'level_drops_between_checks', value: true, score: 1 });
	});

	it('quotes the customer’s own text, capitals and curly apostrophes included', () => {
		expect(match('The fan doesn’t come on!')).toMatchObject([
			{ key: 'fan_runs_when_hot', value: false, from: 'fan doesn’t come on' }
		]);
	});
});

describe('complaint evidence in a diagnosis', () => {
	it('uses matched values as evidence', async () => {
		const withComplaint = await diagnoser.diagnose({
			observations: {},
			complaint: 'sweet smell inside the car and the windows fog up'
		});
		const explicit = await diagnoser.diagnose({
			observations: { sweet_smell: 'cabin', windscreen_film: true }
		});
		expect(withComplaint.causes).toEqual(explicit.causes);
		expect(withComplaint.causes[0].key).toBe('heater_core_leak');
		expect(withComplaint.matched.map((item) => item.key)).toEqual([
			'sweet_smell',
			'windscreen_film'
		]);
	});

	it('lets an explicit answer or an unknown win over a matched one', async () => {
		const diagnosis = await diagnoser.diagnose({
			observations: { sweet_smell: 'none' },
			unknown: ['windscreen_film'],
			complaint: 'sweet smell inside the car and the windows fog up'
		});
		expect(diagnosis.matched).toEqual([]);
		const heater = diagnosis.causes.find((cause) => cause.key === 'heater_core_leak');
		expect(heater?.evidence.map((item) => item.rule)).toEqual(['no-cabin-smell']);
	});

	it('rounds match scores to 4 decimals in the response', async () => {
		const { matched } = await diagnoser.diagnose({
			observations: {},
			complaint: 'gets hot sitting in traffic'
		});
		expect(matched[0].score).toBe(Math.round(matched[0].score * 1e4) / 1e4);
	});
});
