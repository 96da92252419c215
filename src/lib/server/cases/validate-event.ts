// Checks an event against the case's edition and state: known observation keys, values of the
// right kind, tests and steps that exist, complaint matches the complaint really gives.
import { describeInvalidValue, type Rulebook } from '../../diagnosis';
import type { AppendEvent } from '../../api/cases-schema';
import type { Issue } from '../errors';
import { indexRulebook } from './scoring';

export type EventContext = {
	rulebook: Rulebook;
	/** The complaint's matches (the edition's matcher over the case's complaint). */
	complaintMatches: () => { key: string; value: unknown; from: string }[];
};

function checkAnswer(rulebook: Rulebook, key: string, value: unknown, valuePath: string): Issue[] {
	const observation = indexRulebook(rulebook).observations.get(key);
	if (!observation) return [{ path: 'payload.key', message: `unknown observation "${key}"` }];
	if (value === undefined) return [];
	const reason = describeInvalidValue(observation, value);
	return reason ? [{ path: valuePath, message: reason }] : [];
}

type Checked = { issues: Issue[]; payload: Record<string, unknown> };

function checkMatch(
	event: AppendEvent & { payload: { key: string; value: unknown } },
	ctx: EventContext
): Checked {
	const { key, value } = event.payload;
	const issues = checkAnswer(ctx.rulebook, key, value, 'payload.value');
	if (issues.length) return { issues, payload: event.payload };
	const match = ctx.complaintMatches().find((m) => m.key === key && m.value === value);
	if (!match) {
		return {
			issues: [
				{
					path: 'payload',
					message: `the complaint does not suggest ${key} = ${JSON.stringify(value)}`
				}
			],
			payload: event.payload
		};
	}
	return { issues: [], payload: { key, value, from: match.from } };
}

function checkTest(
	event: Extract<AppendEvent, { kind: 'test_step_ticked' | 'test_result_recorded' }>,
	rulebook: Rulebook
): Checked {
	const test = indexRulebook(rulebook).tests.get(event.payload.test);
	if (!test) {
		return {
			issues: [{ path: 'payload.test', message: `unknown test "${event.payload.test}"` }],
			payload: event.payload
		};
	}
	if (event.kind === 'test_step_ticked') {
		const issues =
			event.payload.step < test.steps.length
				? []
				: [
						{
							path: 'payload.step',
							message: `${test.key} has ${test.steps.length} steps (0 to ${test.steps.length - 1})`
						}
					];
		return { issues, payload: event.payload };
	}
	const issues = checkAnswer(rulebook, test.sets, event.payload.value, 'payload.value');
	// The observation the result answers is stored with it, so the timeline reads on its own.
	return { issues, payload: { test: test.key, key: test.sets, value: event.payload.value } };
}

/** Issues with their paths (none: valid) and the payload to store. */
export function checkEvent(event: AppendEvent, ctx: EventContext): Checked {
	switch (event.kind) {
		case 'answer_set':
			return {
				issues: checkAnswer(ctx.rulebook, event.payload.key, event.payload.value, 'payload.value'),
				payload: event.payload
			};
		case 'answer_cleared':
		case 'not_sure':
			return {
				issues: checkAnswer(ctx.rulebook, event.payload.key, undefined, ''),
				payload: event.payload
			};
		case 'complaint_match_accepted':
		case 'complaint_match_rejected':
			return checkMatch(event, ctx);
		case 'test_step_ticked':
		case 'test_result_recorded':
			return checkTest(event, ctx.rulebook);
		default:
			return { issues: [], payload: event.payload };
	}
}
