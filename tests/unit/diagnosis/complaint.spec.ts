import { describe, expect, it } from 'vitest';
import { createDiagnoser, type Phrase, type Rulebook } from '../../../src/lib/diagnosis';
import {
	diagnose,
	makeBooleanObservation,
	makeCoolingRulebook,
	makeEnumObservation
} from './factories';

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

/** The cooling fixture with its phrases replaced for the observations named, plus two invented
 * observations (oil and coolant look, a hot top hose, a leak place) for the look-alike wordings. */
function makeMatcherRulebook(phrases: Record<string, Phrase[]>): Rulebook {
	const rulebook = makeCoolingRulebook();
	rulebook.observations.push(
		makeBooleanObservation({ key: 'oil_milky', group: 'inspection' }),
		makeEnumObservation({
			key: 'coolant_condition',
			values: ['clean', 'oily_film'],
			group: 'inspection',
			frequencies: { clean: 0.8, oily_film: 0.2 }
		}),
		makeBooleanObservation({ key: 'upper_hose_cool_when_hot', group: 'inspection' }),
		makeEnumObservation({
			key: 'visible_leak',
			values: ['none', 'hose_or_clamp'],
			group: 'inspection',
			frequencies: { none: 0.5, hose_or_clamp: 0.5 }
		})
	);
	for (const observation of rulebook.observations) {
		observation.phrases = phrases[observation.key] ?? observation.phrases;
	}
	return rulebook;
}

function matchWith(phrases: Record<string, Phrase[]>, complaint: string) {
	return createDiagnoser(makeMatcherRulebook(phrases)).matchComplaint(complaint);
}

describe('complaint matching: grammar', () => {
	it('reads a contraction as its verb and "not", with or without the apostrophe', () => {
		const phrases = { fan_runs_when_hot: [{ text: 'fan does not come on', value: false }] };
		for (const complaint of [
			"the fan doesn't come on",
			'fan doesnt come on',
			'the fan won’t come on',
			'the fan cannot come on'
		]) {
			expect(matchWith(phrases, complaint), complaint).toMatchObject([
				{ key: 'fan_runs_when_hot', value: false }
			]);
		}
		expect(matchWith(phrases, 'the fan does come on')).toMatchObject([
			{ key: 'fan_runs_when_hot', value: true }
		]);
	});

	it('matches other endings of the same word: idle and idling, drip and dripping', () => {
		expect(match('it overheats at idle')).toMatchObject([
			{ key: 'temp_gauge', value: 'high_at_idle' }
		]);
		expect(match('coolant drips on the ground')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: true }
		]);
	});

	it('reads "not sure if" and "don’t know whether" as no answer, not as a denial', () => {
		expect(match('not sure if the fan kicks in')).toEqual([]);
		expect(match("I don't know whether it's losing water")).toEqual([]);
		// A doubt about why is no doubt about what.
		expect(match('no idea why it gets hot in traffic')).toMatchObject([
			{ key: 'temp_gauge', value: 'high_at_idle' }
		]);
	});

	it('takes "nothing" as a negation and "never used to" as no denial of now', () => {
		expect(match('nothing leaks on the drive')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: false }
		]);
		expect(match('it never used to keep losing coolant')).toMatchObject([
			{ key: 'level_drops_between_checks', value: true }
		]);
	});

	it('never turns a one-word denial round: "no drips" says nothing about "dripping"', () => {
		const phrases = { puddle_under_vehicle: [{ text: 'no drips', value: false }] };
		expect(matchWith(phrases, 'the tap is dripping')).toEqual([]);
		expect(matchWith(phrases, 'there are no drips')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: false }
		]);
	});
});

describe('complaint matching: what customers say', () => {
	it('reads a guess as no answer: "I think", "maybe", a trailing "not sure"', () => {
		expect(match('I think the fan kicks in')).toEqual([]);
		expect(match('maybe it is losing water')).toEqual([]);
		expect(match('the fan kicks in, not sure')).toEqual([]);
		expect(match('the fan kicks in I think')).toEqual([]);
		// The guess stays in its clause: the traffic clause after "and" is said outright.
		expect(match('I think the fan kicks in and it gets hot in traffic')).toMatchObject([
			{ key: 'temp_gauge', value: 'high_at_idle' }
		]);
	});

	it('reads a late or weak yes as no plain yes: "the fan kicks in late", "slow to come on"', () => {
		expect(match('the fan kicks in late')).toEqual([]);
		expect(match('the fan kicks in eventually')).toEqual([]);
		expect(match('the fan kicks in when it is already boiling')).toEqual([]);
		expect(match('the fan kicks in fine')).toMatchObject([
			{ key: 'fan_runs_when_hot', value: true }
		]);
		// "Slow" names a place in "slow traffic", not a late finding.
		expect(match('hot in slow traffic')).toMatchObject([
			{ key: 'temp_gauge', value: 'high_at_idle' }
		]);
		// A denial stays a denial, late or not.
		expect(match('the fan never comes on, not even late')).toMatchObject([
			{ key: 'fan_runs_when_hot', value: false }
		]);
	});

	it('keeps "only sometimes" as said: a frequency is no denial', () => {
		expect(match('only sometimes it leaks on the drive')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: true }
		]);
	});

	it('reads misspelt and misplaced contractions as a denial: "dosent", "does\'nt"', () => {
		const phrases = { fan_runs_when_hot: [{ text: 'fan does not come on', value: false }] };
		for (const complaint of [
			'the fan dosent come on',
			"the fan does'nt come on",
			'fan dosnt come on'
		]) {
			expect(matchWith(phrases, complaint), complaint).toMatchObject([
				{ key: 'fan_runs_when_hot', value: false }
			]);
		}
	});

	it('reads an irregular past tense as its verb: "the fan never came on"', () => {
		expect(match('the fan never came on')).toMatchObject([
			{ key: 'fan_runs_when_hot', value: false, from: 'fan never came on' }
		]);
	});

	it('lets one negation cover a short list: "no drips or leaks on the drive, nothing"', () => {
		expect(match('no smoke or leaks on the drive, nothing')).toMatchObject([
			{ key: 'puddle_under_vehicle', value: false, from: 'no smoke or leaks on the drive' }
		]);
	});
});

describe('complaint matching: rival readings', () => {
	it('lets a phrase that says more win over a shorter one of the same observation', () => {
		const phrases = {
			exhaust_smoke: [
				{ text: 'white smoke', value: 'white_persistent' },
				{ text: 'white smoke on cold mornings', value: 'white_at_cold_start_only' }
			]
		};
		expect(matchWith(phrases, 'white smoke on cold mornings')).toMatchObject([
			{ key: 'exhaust_smoke', value: 'white_at_cold_start_only' }
		]);
		expect(matchWith(phrases, 'white smoke from the back')).toMatchObject([
			{ key: 'exhaust_smoke', value: 'white_persistent' }
		]);
		const thermostat = {
			temp_gauge: [
				{ text: 'stuck thermostat', value: 'high_always' },
				{ text: 'thermostat stuck open', value: 'normal' }
			]
		};
		expect(matchWith(thermostat, 'thermostat stuck open')).toMatchObject([
			{ key: 'temp_gauge', value: 'normal' }
		]);
	});

	it('reads no second observation from words a longer match already explains', () => {
		const phrases = {
			sweet_smell: [{ text: 'smells sweet', value: 'engine_bay' }],
			exhaust_smoke: [{ text: 'exhaust smells sweet', value: 'white_persistent' }]
		};
		expect(matchWith(phrases, 'the exhaust smells sweet')).toEqual([
			{ key: 'exhaust_smoke', value: 'white_persistent', from: 'exhaust smells sweet', score: 1 }
		]);
		expect(matchWith(phrases, 'it smells sweet after a drive')).toMatchObject([
			{ key: 'sweet_smell', value: 'engine_bay' }
		]);
	});

	it('lets an observation already answered keep its words from another reading', () => {
		const diagnoser = createDiagnoser(
			makeMatcherRulebook({
				sweet_smell: [{ text: 'smells sweet', value: 'engine_bay' }],
				exhaust_smoke: [{ text: 'exhaust smells sweet', value: 'white_persistent' }]
			})
		);
		// The technician has answered the smoke question; the smell is still the exhaust's.
		expect(
			diagnoser.matchComplaint('the exhaust smells sweet', new Set(['exhaust_smoke']))
		).toEqual([]);
	});

	it('tells "coolant in the oil" from "oil in the coolant" by word order', () => {
		const phrases = {
			oil_milky: [{ text: 'coolant in the oil', value: true }],
			coolant_condition: [{ text: 'oil in the coolant', value: 'oily_film' }]
		};
		expect(matchWith(phrases, 'there is coolant in the oil')).toEqual([
			{ key: 'oil_milky', value: true, from: 'coolant in the oil', score: 1 }
		]);
		expect(matchWith(phrases, 'I found oil in the coolant')).toEqual([
			{ key: 'coolant_condition', value: 'oily_film', from: 'oil in the coolant', score: 1 }
		]);
	});

	it('keeps the better of two readings that share words', () => {
		const phrases = {
			upper_hose_cool_when_hot: [{ text: 'top radiator hose is hot', value: false }],
			visible_leak: [{ text: 'radiator hose leaking', value: 'hose_or_clamp' }]
		};
		// Three of the four words of the hot-hose phrase are there, but the leak reads them all.
		expect(matchWith(phrases, 'the top radiator hose is leaking')).toMatchObject([
			{ key: 'visible_leak', value: 'hose_or_clamp' }
		]);
		expect(matchWith(phrases, 'the top radiator hose is leaking')).toHaveLength(1);
		expect(matchWith(phrases, 'top radiator hose is hot')).toMatchObject([
			{ key: 'upper_hose_cool_when_hot', value: false }
		]);
	});

	it('keeps two observations read from exactly the same words when they score the same', () => {
		const phrases = {
			puddle_under_vehicle: [{ text: 'boiled over', value: true }],
			windscreen_film: [{ text: 'boiled over', value: true }]
		};
		expect(matchWith(phrases, 'it boiled over').map((item) => item.key)).toEqual([
			'puddle_under_vehicle',
			'windscreen_film'
		]);
	});
});

describe('complaint evidence in a diagnosis', () => {
	it('uses matched values as evidence', async () => {
		const withComplaint = await diagnose(diagnoser, {
			observations: {},
			complaint: 'sweet smell inside the car and the windows fog up'
		});
		const explicit = await diagnose(diagnoser, {
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
		const diagnosis = await diagnose(diagnoser, {
			observations: { sweet_smell: 'none' },
			unknown: ['windscreen_film'],
			complaint: 'sweet smell inside the car and the windows fog up'
		});
		expect(diagnosis.matched).toEqual([]);
		const heater = diagnosis.causes.find((cause) => cause.key === 'heater_core_leak');
		expect(heater?.evidence.map((item) => item.rule)).toEqual(['no-cabin-smell']);
	});

	it('rounds match scores to 4 decimals in the response', async () => {
		const { matched } = await diagnose(diagnoser, {
			observations: {},
			complaint: 'gets hot sitting in traffic'
		});
		expect(matched[0].score).toBe(Math.round(matched[0].score * 1e4) / 1e4);
	});
});
