// The rulebook schema: causes, observations, rules and tests, and the checks a rulebook must pass.
import { z } from 'zod';
import { formatIssuePath } from '../calculators/format';

// The rulebook schema validates the ASSEMBLED rulebook ({ meta, causes, observations, rules, tests }),
// because that is what an edition stores; the file loader maps issue paths back to files.

export const CAUSE_KEY_PATTERN = /^[a-z][a-z0-9_]*$/;
export const RULE_KEY_PATTERN = /^[a-z0-9]+(-[a-z0-9]+)*$/;
export const NO_SOURCE = 'common practice, no source';
export const MAX_CONDITION_DEPTH = 3;
export const LR_MIN = 0.01;
export const LR_MAX = 100;
/** Answer frequencies and bin frequencies must sum to 1 within this tolerance. */
export const FREQUENCY_SUM_TOLERANCE = 0.01;

export const OBSERVATION_GROUPS = [
	'vehicle_history',
	'symptom',
	'inspection',
	'test_result'
] as const;
export const OBSERVATION_KINDS = ['boolean', 'enum', 'number'] as const;
export const SET_OPERATORS = ['in', 'notIn'] as const;
export const SCALAR_OPERATORS = ['equal', 'notEqual'] as const;
export const NUMBER_OPERATORS = [
	'lessThan',
	'lessThanInclusive',
	'greaterThan',
	'greaterThanInclusive'
] as const;
export const CONDITION_OPERATORS = [
	...SCALAR_OPERATORS,
	...SET_OPERATORS,
	...NUMBER_OPERATORS
] as const;

export type ObservationValue = boolean | string | number;
export type ObservationKind = (typeof OBSERVATION_KINDS)[number];
export type ObservationGroup = (typeof OBSERVATION_GROUPS)[number];
export type ConditionOperator = (typeof CONDITION_OPERATORS)[number];

export interface ConditionLeaf {
	fact: string;
	operator: ConditionOperator;
	value: ObservationValue | ObservationValue[];
}
export type ConditionGroup = { all: Condition[] } | { any: Condition[] };
export type Condition = ConditionLeaf | ConditionGroup;
/** json-rules-engine TopLevelCondition restricted to all/any (never `not`). */
export type TopLevelCondition = ConditionGroup;

export interface RulebookIssue {
	path: string;
	message: string;
}

const keySchema = z
	.string()
	.regex(CAUSE_KEY_PATTERN, 'must be snake_case: a lower-case letter, then a-z, 0-9 or _');
const textSchema = z.string().trim().min(1, 'must not be empty');
const cautionsSchema = z.array(textSchema).default([]);

export const bandsSchema = z
	.strictObject({
		likely: z.number().gt(0).lt(1),
		possible: z.number().gt(0).lt(1)
	})
	.superRefine((bands, ctx) => {
		if (!(bands.possible < bands.likely)) {
			ctx.addIssue({
				code: 'custom',
				path: ['possible'],
				message: `bands must be ordered 0 < possible < likely < 1 (possible ${bands.possible}, likely ${bands.likely})`
			});
		}
	});

export const metaSchema = z.strictObject({
	name: textSchema,
	schemaVersion: z.literal(1),
	bands: bandsSchema,
	cautions: cautionsSchema
});

export const causeSchema = z.strictObject({
	key: keySchema,
	name: textSchema,
	prior: z.number().gt(0, 'prior must be above 0').lt(1, 'prior must be below 1'),
	description: z.string().optional(),
	usualFix: z.string().optional(),
	cautions: cautionsSchema
});

const phraseSchema = z.strictObject({
	text: textSchema.refine((text) => text === text.toLowerCase(), 'phrase text must be lower-case'),
	value: z.union([z.boolean(), z.string(), z.number()])
});

const observationBase = {
	key: keySchema,
	prompt: textSchema,
	help: z.string().optional(),
	group: z.enum(OBSERVATION_GROUPS),
	cautions: cautionsSchema,
	phrases: z.array(phraseSchema).default([])
};

const frequenciesSchema = z.record(z.string(), z.number().min(0).max(1));

const booleanObservationSchema = z.strictObject({
	...observationBase,
	kind: z.literal('boolean'),
	frequencies: frequenciesSchema
});

const enumObservationSchema = z.strictObject({
	...observationBase,
	kind: z.literal('enum'),
	values: z.array(keySchema).min(1, 'an enum needs at least one value'),
	valueLabels: z.record(z.string(), textSchema).optional(),
	frequencies: frequenciesSchema
});

const binSchema = z.strictObject({
	value: z.number().refine(Number.isFinite, 'must be a finite number'),
	label: textSchema,
	frequency: z.number().min(0).max(1)
});

const numberObservationSchema = z.strictObject({
	...observationBase,
	kind: z.literal('number'),
	unit: textSchema,
	min: z.number().refine(Number.isFinite, 'must be a finite number'),
	max: z.number().refine(Number.isFinite, 'must be a finite number'),
	bins: z.array(binSchema).min(1, 'a number observation needs at least one bin')
});

export const observationSchema = z
	.discriminatedUnion('kind', [
		booleanObservationSchema,
		enumObservationSchema,
		numberObservationSchema
	])
	.superRefine((observation, ctx) => {
		for (const issue of checkObservation(observation)) ctx.addIssue({ code: 'custom', ...issue });
	});

export const conditionSchema = z.custom<TopLevelCondition>().superRefine((condition, ctx) => {
	for (const issue of checkConditionShape(condition, [], 1)) {
		ctx.addIssue({ code: 'custom', ...issue });
	}
});

export const ruleSchema = z.strictObject({
	key: z
		.string()
		.regex(RULE_KEY_PATTERN, 'must be kebab-case: a-z and 0-9 words joined by single hyphens'),
	cause: keySchema,
	lr: z
		.number()
		.refine(Number.isFinite, 'lr must be a finite number')
		.refine((lr) => lr > 0, 'lr must be above 0')
		.refine((lr) => lr !== 1, 'lr must not be 1 (a rule with lr 1 changes nothing)')
		.refine((lr) => lr >= LR_MIN && lr <= LR_MAX, `lr must be between ${LR_MIN} and ${LR_MAX}`),
	conditions: conditionSchema,
	rationale: textSchema,
	source: textSchema
});

export const confirmingTestSchema = z.strictObject({
	key: keySchema,
	name: textSchema,
	minutes: z.number().gt(0, 'minutes must be above 0').refine(Number.isFinite, 'must be finite'),
	equipment: z.array(textSchema).default([]),
	steps: z.array(textSchema).min(1, 'a test needs at least one step'),
	cautions: cautionsSchema,
	sets: keySchema
});

export const rulebookShapeSchema = z.strictObject({
	meta: metaSchema,
	causes: z.array(causeSchema).min(1, 'a rulebook needs at least one cause'),
	observations: z.array(observationSchema).min(1, 'a rulebook needs at least one observation'),
	rules: z.array(ruleSchema).min(1, 'a rulebook needs at least one rule'),
	tests: z.array(confirmingTestSchema).default([])
});

export const rulebookSchema = rulebookShapeSchema.superRefine((rulebook, ctx) => {
	for (const issue of checkCrossReferences(rulebook)) ctx.addIssue({ code: 'custom', ...issue });
});

export type Rulebook = z.infer<typeof rulebookSchema>;
export type RulebookMeta = z.infer<typeof metaSchema>;
export type Bands = z.infer<typeof bandsSchema>;
export type Cause = z.infer<typeof causeSchema>;
export type Observation = z.infer<typeof observationSchema>;
export type BooleanObservation = z.infer<typeof booleanObservationSchema>;
export type EnumObservation = z.infer<typeof enumObservationSchema>;
export type NumberObservation = z.infer<typeof numberObservationSchema>;
export type Phrase = z.infer<typeof phraseSchema>;
export type Bin = z.infer<typeof binSchema>;
export type Rule = z.infer<typeof ruleSchema>;
export type ConfirmingTest = z.infer<typeof confirmingTestSchema>;
export type Band = 'likely' | 'possible' | 'unlikely';

type PathSegment = string | number;
interface PathIssue {
	path: PathSegment[];
	message: string;
}

export function parseRulebook(
	json: unknown
): { ok: true; rulebook: Rulebook } | { ok: false; issues: RulebookIssue[] } {
	const result = rulebookSchema.safeParse(json);
	if (result.success) return { ok: true, rulebook: result.data };
	return {
		ok: false,
		issues: result.error.issues.map((issue) => ({
			path: formatIssuePath(issue.path),
			message: issue.message
		}))
	};
}

/** The values an observation can take, as strings: the keys of its `frequencies`. */
export function listAnswerKeys(observation: Observation): string[] {
	if (observation.kind === 'boolean') return ['true', 'false'];
	if (observation.kind === 'enum') return observation.values;
	return observation.bins.map((bin) => String(bin.value));
}

/** Why `value` is not a valid answer of `observation`, or null when it is. */
export function describeInvalidValue(observation: Observation, value: unknown): string | null {
	if (observation.kind === 'boolean') {
		return typeof value === 'boolean'
			? null
			: `${JSON.stringify(value)} is not a boolean; ${observation.key} is a yes/no observation`;
	}
	if (observation.kind === 'enum') {
		if (typeof value !== 'string') {
			return `${JSON.stringify(value)} is not a string; ${observation.key} takes one of: ${observation.values.join(', ')}`;
		}
		return observation.values.includes(value)
			? null
			: `"${value}" is not one of ${observation.key}'s values (${observation.values.join(', ')})`;
	}
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		return `${JSON.stringify(value)} is not a finite number; ${observation.key} is a number in ${observation.unit}`;
	}
	if (value < observation.min || value > observation.max) {
		return `${value} is outside ${observation.key}'s range ${observation.min} to ${observation.max} ${observation.unit}`;
	}
	return null;
}

function checkFrequencySum(
	total: number,
	path: PathSegment[],
	what: string,
	issues: PathIssue[]
): void {
	if (Math.abs(total - 1) > FREQUENCY_SUM_TOLERANCE) {
		issues.push({
			path,
			message: `${what} must sum to 1 (±${FREQUENCY_SUM_TOLERANCE}); they sum to ${Number(total.toFixed(6))}`
		});
	}
}

/** An enum's values are distinct and its labels name only those values. */
function checkEnumValues(observation: EnumObservation, issues: PathIssue[]): void {
	const seen = new Set<string>();
	observation.values.forEach((value, index) => {
		if (seen.has(value)) {
			issues.push({ path: ['values', index], message: `duplicate enum value "${value}"` });
		}
		seen.add(value);
	});
	for (const labelKey of Object.keys(observation.valueLabels ?? {})) {
		if (!observation.values.includes(labelKey)) {
			issues.push({
				path: ['valueLabels', labelKey],
				message: `"${labelKey}" is not one of ${observation.key}'s values`
			});
		}
	}
}

/** A number's range is not empty and its bins are distinct, within it, and sum to 1. */
function checkNumberBins(observation: NumberObservation, issues: PathIssue[]): void {
	if (!(observation.min < observation.max)) {
		issues.push({
			path: ['max'],
			message: `max (${observation.max}) must be above min (${observation.min})`
		});
	}
	const seenBins = new Set<number>();
	let total = 0;
	observation.bins.forEach((bin, index) => {
		total += bin.frequency;
		if (bin.value < observation.min || bin.value > observation.max) {
			issues.push({
				path: ['bins', index, 'value'],
				message: `${bin.value} is outside ${observation.key}'s range ${observation.min} to ${observation.max}`
			});
		}
		if (seenBins.has(bin.value)) {
			issues.push({
				path: ['bins', index, 'value'],
				message: `duplicate bin value ${bin.value}`
			});
		}
		seenBins.add(bin.value);
	});
	checkFrequencySum(total, ['bins'], 'bin frequencies', issues);
}

/** A boolean's or enum's frequencies: one per value, no others, summing to 1. */
function checkAnswerFrequencies(
	observation: BooleanObservation | EnumObservation,
	issues: PathIssue[]
): void {
	const expected = listAnswerKeys(observation);
	let total = 0;
	for (const answer of expected) {
		const frequency = observation.frequencies[answer];
		if (frequency === undefined) {
			issues.push({
				path: ['frequencies'],
				message: `frequency of "${answer}" is missing (every value needs one)`
			});
		} else {
			total += frequency;
		}
	}
	for (const answer of Object.keys(observation.frequencies)) {
		if (!expected.includes(answer)) {
			issues.push({
				path: ['frequencies', answer],
				message: `"${answer}" is not a value of ${observation.key} (${expected.join(', ')})`
			});
		}
	}
	checkFrequencySum(total, ['frequencies'], 'frequencies', issues);
}

function checkObservation(observation: Observation): PathIssue[] {
	const issues: PathIssue[] = [];
	if (observation.kind === 'enum') checkEnumValues(observation, issues);
	if (observation.kind === 'number') checkNumberBins(observation, issues);
	else checkAnswerFrequencies(observation, issues);
	observation.phrases.forEach((phrase, index) => {
		const reason = describeInvalidValue(observation, phrase.value);
		if (reason) issues.push({ path: ['phrases', index, 'value'], message: reason });
	});
	return issues;
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
	return typeof value === 'object' && value !== null && !Array.isArray(value);
}

const LEAF_KEYS = new Set(['fact', 'operator', 'value']);

/** Shape of one condition (no rulebook context): all/any groups, leaves, no `not`, depth. */
function checkConditionShape(condition: unknown, path: PathSegment[], depth: number): PathIssue[] {
	if (!isPlainObject(condition)) {
		return [{ path, message: 'a condition must be an object' }];
	}
	if ('not' in condition) {
		return [
			{
				path: [...path, 'not'],
				message:
					'"not" is not allowed: it would let an unanswered observation satisfy the condition; use notEqual/notIn on answered observations'
			}
		];
	}
	const groupKeys = ['all', 'any'].filter((key) => key in condition);
	const isTopLevel = path.length === 0;
	if (groupKeys.length === 0 && isTopLevel) {
		return [{ path, message: 'conditions must be { "all": [...] } or { "any": [...] }' }];
	}
	if (groupKeys.length > 0) return checkGroupShape(condition, groupKeys, path, depth);
	return checkLeafShape(condition, path);
}

/** An all/any group: one key, not too deep, a non-empty array of conditions. */
function checkGroupShape(
	condition: Record<string, unknown>,
	groupKeys: string[],
	path: PathSegment[],
	depth: number
): PathIssue[] {
	const issues: PathIssue[] = [];
	if (groupKeys.length > 1 || Object.keys(condition).length > 1) {
		issues.push({
			path,
			message: 'a condition group has exactly one key, "all" or "any"'
		});
		return issues;
	}
	const groupKey = groupKeys[0];
	if (depth > MAX_CONDITION_DEPTH) {
		return [
			{ path, message: `conditions nest all/any at most ${MAX_CONDITION_DEPTH} levels deep` }
		];
	}
	const members = condition[groupKey];
	if (!Array.isArray(members) || members.length === 0) {
		return [{ path: [...path, groupKey], message: `"${groupKey}" must be a non-empty array` }];
	}
	members.forEach((member, index) => {
		issues.push(...checkConditionShape(member, [...path, groupKey, index], depth + 1));
	});
	return issues;
}

/** A leaf: fact, operator and value only, with a known operator. */
function checkLeafShape(condition: Record<string, unknown>, path: PathSegment[]): PathIssue[] {
	const issues: PathIssue[] = [];
	for (const key of Object.keys(condition)) {
		if (!LEAF_KEYS.has(key)) {
			issues.push({
				path: [...path, key],
				message: `"${key}" is not allowed in a condition (only fact, operator, value)`
			});
		}
	}
	if (typeof condition.fact !== 'string' || condition.fact === '') {
		issues.push({ path: [...path, 'fact'], message: 'fact must be an observation key' });
	}
	if (!(CONDITION_OPERATORS as readonly unknown[]).includes(condition.operator)) {
		issues.push({
			path: [...path, 'operator'],
			message: `operator ${JSON.stringify(condition.operator)} is not one of ${CONDITION_OPERATORS.join(', ')}`
		});
	}
	if (!('value' in condition)) {
		issues.push({ path: [...path, 'value'], message: 'value is required' });
	}
	return issues;
}

function findDuplicateKeys(
	items: readonly { key: string }[],
	collection: string,
	what: string
): PathIssue[] {
	const seen = new Set<string>();
	const issues: PathIssue[] = [];
	items.forEach((item, index) => {
		if (seen.has(item.key)) {
			issues.push({
				path: [collection, index, 'key'],
				message: `duplicate ${what} key "${item.key}"`
			});
		}
		seen.add(item.key);
	});
	return issues;
}

/** Visit every leaf of a condition tree with its path. */
export function forEachConditionLeaf(
	condition: Condition,
	visit: (leaf: ConditionLeaf, path: PathSegment[]) => void,
	path: PathSegment[] = []
): void {
	if ('all' in condition) {
		condition.all.forEach((member, index) =>
			forEachConditionLeaf(member, visit, [...path, 'all', index])
		);
	} else if ('any' in condition) {
		condition.any.forEach((member, index) =>
			forEachConditionLeaf(member, visit, [...path, 'any', index])
		);
	} else {
		visit(condition, path);
	}
}

/** Observation keys a condition tree mentions, in first-seen order. */
export function listConditionFacts(condition: Condition): string[] {
	const facts: string[] = [];
	forEachConditionLeaf(condition, (leaf) => {
		if (!facts.includes(leaf.fact)) facts.push(leaf.fact);
	});
	return facts;
}

function checkLeafAgainstObservation(
	leaf: ConditionLeaf,
	observation: Observation,
	path: PathSegment[]
): PathIssue[] {
	const operator = leaf.operator;
	const isNumberOperator = (NUMBER_OPERATORS as readonly string[]).includes(operator);
	if (isNumberOperator && observation.kind !== 'number') {
		return [
			{
				path: [...path, 'operator'],
				message: `operator ${operator} needs a number observation; ${observation.key} is ${observation.kind}`
			}
		];
	}
	const isSetOperator = (SET_OPERATORS as readonly string[]).includes(operator);
	if (isSetOperator) {
		if (!Array.isArray(leaf.value) || leaf.value.length === 0) {
			return [
				{ path: [...path, 'value'], message: `${operator} needs a non-empty array of values` }
			];
		}
		const issues: PathIssue[] = [];
		leaf.value.forEach((item, index) => {
			const reason = describeInvalidValue(observation, item);
			if (reason) issues.push({ path: [...path, 'value', index], message: reason });
		});
		return issues;
	}
	if (Array.isArray(leaf.value)) {
		return [
			{ path: [...path, 'value'], message: `${operator} compares with one value, not an array` }
		];
	}
	const reason = describeInvalidValue(observation, leaf.value);
	return reason ? [{ path: [...path, 'value'], message: reason }] : [];
}

type RulebookShape = z.output<typeof rulebookShapeSchema>;

/** With no evidence nothing may be called likely: every prior stays below bands.likely. */
function checkPriors(rulebook: RulebookShape, issues: PathIssue[]): void {
	rulebook.causes.forEach((cause, index) => {
		if (cause.prior >= rulebook.meta.bands.likely) {
			issues.push({
				path: ['causes', index, 'prior'],
				message: `prior ${cause.prior} must stay below bands.likely (${rulebook.meta.bands.likely}): with no evidence nothing may be called likely`
			});
		}
	});
}

/**
 * Each rule names a known cause and its leaves fit known observations. Returns the causes some
 * rule supports (lr > 1).
 */
function checkRuleReferences(
	rulebook: RulebookShape,
	observationsByKey: ReadonlyMap<string, Observation>,
	issues: PathIssue[]
): Set<string> {
	const causeKeys = new Set(rulebook.causes.map((cause) => cause.key));
	const supportedCauses = new Set<string>();
	rulebook.rules.forEach((rule, index) => {
		if (!causeKeys.has(rule.cause)) {
			issues.push({ path: ['rules', index, 'cause'], message: `unknown cause "${rule.cause}"` });
		}
		if (rule.lr > 1) supportedCauses.add(rule.cause);
		forEachConditionLeaf(
			rule.conditions,
			(leaf, leafPath) => {
				const observation = observationsByKey.get(leaf.fact);
				if (!observation) {
					issues.push({
						path: [...leafPath, 'fact'],
						message: `unknown observation "${leaf.fact}"`
					});
					return;
				}
				issues.push(...checkLeafAgainstObservation(leaf, observation, leafPath));
			},
			['rules', index, 'conditions']
		);
	});
	return supportedCauses;
}

/** Each test sets a known observation, and each test_result observation is set by a test. */
function checkTestReferences(
	rulebook: RulebookShape,
	observationsByKey: ReadonlyMap<string, Observation>,
	issues: PathIssue[]
): void {
	const setObservations = new Set<string>();
	rulebook.tests.forEach((test, index) => {
		if (!observationsByKey.has(test.sets)) {
			issues.push({
				path: ['tests', index, 'sets'],
				message: `unknown observation "${test.sets}"`
			});
		}
		setObservations.add(test.sets);
	});
	rulebook.observations.forEach((observation, index) => {
		if (observation.group === 'test_result' && !setObservations.has(observation.key)) {
			issues.push({
				path: ['observations', index, 'group'],
				message: `"${observation.key}" is a test_result but no confirming test sets it`
			});
		}
	});
}

function checkCrossReferences(rulebook: RulebookShape): PathIssue[] {
	const issues: PathIssue[] = [
		...findDuplicateKeys(rulebook.causes, 'causes', 'cause'),
		...findDuplicateKeys(rulebook.observations, 'observations', 'observation'),
		...findDuplicateKeys(rulebook.rules, 'rules', 'rule'),
		...findDuplicateKeys(rulebook.tests, 'tests', 'test')
	];
	const observationsByKey = new Map<string, Observation>();
	for (const observation of rulebook.observations) {
		if (!observationsByKey.has(observation.key))
			observationsByKey.set(observation.key, observation);
	}

	checkPriors(rulebook, issues);
	const supportedCauses = checkRuleReferences(rulebook, observationsByKey, issues);
	rulebook.causes.forEach((cause, index) => {
		if (!supportedCauses.has(cause.key)) {
			issues.push({
				path: ['causes', index, 'key'],
				message: `no rule supports cause "${cause.key}" (every cause needs a rule with lr > 1)`
			});
		}
	});

	checkTestReferences(rulebook, observationsByKey, issues);
	return issues;
}
