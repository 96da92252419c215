import { describe, expect, it } from 'vitest';
import {
	applyEvent,
	deriveCaseState,
	restoreCaseState,
	storeCaseState,
	settledKeys,
	toDiagnoseInput,
	type TimelineEvent
} from '../../../src/lib/cases/answers';

let seq = 0;
const event = (kind: TimelineEvent['kind'], payload: Record<string, unknown>): TimelineEvent => ({
	seq: ++seq,
	kind,
	payload
});

describe('a case’s answers derived from its timeline', () => {
	it('starts from the answers and "not sure" keys the case opened with', () => {
		const state = deriveCaseState([
			event('case_opened', {
				observations: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false },
				unknown: ['fan_circuit_test'],
				complaint: 'runs hot in traffic'
			})
		]);
		expect(toDiagnoseInput(state)).toEqual({
			observations: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false },
			unknown: ['fan_circuit_test']
		});
		expect(state.answers.get('temp_gauge')?.source).toBe('intake');
	});

	it('keeps the later answer in server order, whatever order the events are listed in', () => {
		const first = event('answer_set', { key: 'coolant_level', value: 'low' });
		const second = event('answer_set', { key: 'coolant_level', value: 'full' });
		for (const events of [
			[first, second],
			[second, first]
		]) {
			const answer = deriveCaseState(events).answers.get('coolant_level');
			expect(answer).toEqual({
				key: 'coolant_level',
				value: 'full',
				seq: second.seq,
				source: 'answer'
			});
		}
	});

	it('clears an answer, and "not sure" replaces an answer until the next one', () => {
		const events = [
			event('answer_set', { key: 'sweet_smell', value: 'cabin' }),
			event('answer_cleared', { key: 'sweet_smell' }),
			event('answer_set', { key: 'oil_milky', value: true }),
			event('not_sure', { key: 'oil_milky' })
		];
		const state = deriveCaseState(events);
		expect(toDiagnoseInput(state)).toEqual({ observations: {}, unknown: ['oil_milky'] });
		const answeredAgain = deriveCaseState([
			...events,
			event('answer_set', { key: 'oil_milky', value: false })
		]);
		expect(toDiagnoseInput(answeredAgain)).toEqual({
			observations: { oil_milky: false },
			unknown: []
		});
	});

	it('counts a complaint match only once accepted, with its words, and a rejection withdraws it', () => {
		const accepted = event('complaint_match_accepted', {
			key: 'temp_gauge',
			value: 'high_at_idle',
			from: 'hot sitting in traffic'
		});
		const state = deriveCaseState([accepted]);
		expect(state.answers.get('temp_gauge')).toEqual({
			key: 'temp_gauge',
			value: 'high_at_idle',
			seq: accepted.seq,
			source: 'complaint',
			from: 'hot sitting in traffic'
		});
		const rejected = deriveCaseState([
			accepted,
			event('complaint_match_rejected', { key: 'temp_gauge', value: 'high_at_idle' })
		]);
		expect(rejected.answers.has('temp_gauge')).toBe(false);
		expect(settledKeys(rejected)).toContain('temp_gauge');
	});

	it('a rejected match leaves a technician’s own answer to the same question alone', () => {
		const state = deriveCaseState([
			event('answer_set', { key: 'fan_runs_when_hot', value: true }),
			event('complaint_match_rejected', { key: 'fan_runs_when_hot', value: false })
		]);
		expect(state.answers.get('fan_runs_when_hot')?.value).toBe(true);
	});

	it('a recorded test result answers the observation the test sets; ticks toggle per step', () => {
		const state = deriveCaseState([
			event('test_step_ticked', { test: 'pressure_test', step: 0, done: true }),
			event('test_step_ticked', { test: 'pressure_test', step: 1, done: true }),
			event('test_step_ticked', { test: 'pressure_test', step: 0, done: false }),
			event('test_result_recorded', {
				test: 'pressure_test',
				key: 'pressure_test',
				value: 'holds'
			}),
			event('note', { text: 'customer waiting' })
		]);
		expect([...state.ticks.get('pressure_test')!]).toEqual([1]);
		expect(state.answers.get('pressure_test')).toMatchObject({
			value: 'holds',
			source: 'test',
			test: 'pressure_test'
		});
	});

	it('leaves out answers the edition does not know (after a rescore)', () => {
		const state = deriveCaseState([
			event('answer_set', { key: 'dropped_in_new_edition', value: true }),
			event('answer_set', { key: 'coolant_level', value: 'low' })
		]);
		expect(toDiagnoseInput(state, (key) => key === 'coolant_level').observations).toEqual({
			coolant_level: 'low'
		});
	});
});

describe('the state kept on the case row', () => {
	const events = [
		event('case_opened', { observations: { coolant_level: 'low' }, unknown: ['oil_milky'] }),
		event('complaint_match_accepted', {
			key: 'temp_gauge',
			value: 'high_at_idle',
			from: 'in traffic'
		}),
		event('complaint_match_rejected', { key: 'sweet_smell', value: 'cabin' }),
		event('test_step_ticked', { test: 'pressure_cap_test', step: 3, done: true })
	];
	const lastSeq = events.at(-1)!.seq;

	it('restores to the same state, and applying the next event to it equals deriving anew', () => {
		const stored = JSON.parse(JSON.stringify(storeCaseState(deriveCaseState(events), lastSeq)));
		const restored = restoreCaseState(stored, lastSeq);
		expect(restored).toEqual(deriveCaseState(events));
		const next = event('answer_set', { key: 'coolant_level', value: 'full' });
		expect(applyEvent(restored!, next)).toEqual(deriveCaseState([...events, next]));
	});

	it('is not used when it is behind the case’s last event or missing', () => {
		const stored = storeCaseState(deriveCaseState(events), lastSeq);
		expect(restoreCaseState(stored, lastSeq + 1)).toBeNull();
		expect(restoreCaseState(null, lastSeq)).toBeNull();
	});
});
