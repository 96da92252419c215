// Next questions: which unanswered observation would most reduce the uncertainty of the causes.
import { GAIN_DECIMALS } from '../api/round';
import { roundTo } from '../calculators/format';
import { compareKeys } from './rank';
import type { CompiledRule, CompiledRulebook, FactVector, FiredMask } from './evaluate';
import type {
	Bin,
	Observation,
	ObservationGroup,
	ObservationKind,
	ObservationValue
} from './schema';

/** Answer frequencies that replace the rulebook's, e.g. from a shop's closed cases:
 * `{ temp_gauge: { normal: 0.4, high_at_idle: 0.3, … }, fan_runs_when_hot: { true: 0.8, false: 0.2 } }`.
 * For a number observation the keys are its bin values as strings. */
export type FrequencyOverrides = Record<string, Record<string, number>>;

export interface AnswerOption {
	value: ObservationValue;
	probability: number;
}

export interface NextQuestion {
	key: string;
	prompt: string;
	/** Expected reduction of Σ_c h(p_c), in bits; full precision until a response is built. */
	expectedGain: number;
	kind: ObservationKind;
	group: ObservationGroup;
	help?: string;
	cautions: string[];
	values?: string[];
	valueLabels?: Record<string, string>;
	unit?: string;
	min?: number;
	max?: number;
	bins?: Bin[];
	/** Set by `diagnose`: true when asking it is not worth its time (see `advice.ts`). */
	lowValue?: boolean;
}

export function binaryEntropyBits(probability: number): number {
	if (probability <= 0 || probability >= 1) return 0;
	return -(probability * Math.log2(probability) + (1 - probability) * Math.log2(1 - probability));
}

/**
 * h(σ(x)) in bits, straight from log-odds x: with e = exp(−|x|), h = ln(1 + e) + |x|·e / (1 + e)
 * nats (h is symmetric in x). One exp and one log instead of the exp of the logistic and the two
 * logs of the entropy; the look-ahead calls it for every cause each answer moves.
 */
export function entropyBitsOfLogOdds(logOdds: number): number {
	const x = Math.abs(logOdds);
	const e = Math.exp(-x);
	return (Math.log1p(e) + (x * e) / (1 + e)) / Math.LN2;
}

function listDefaultOptions(observation: Observation): AnswerOption[] {
	if (observation.kind === 'number') {
		return observation.bins.map((bin) => ({ value: bin.value, probability: bin.frequency }));
	}
	const values: ObservationValue[] =
		observation.kind === 'boolean' ? [true, false] : observation.values;
	return values.map((value) => ({
		value,
		probability: observation.frequencies[String(value)] ?? 0
	}));
}

function normaliseOptions(options: AnswerOption[]): AnswerOption[] | null {
	const total = options.reduce((sum, option) => sum + option.probability, 0);
	if (!(total > 0) || !Number.isFinite(total)) return null;
	return options.map((option) => ({
		value: option.value,
		probability: option.probability / total
	}));
}

/**
 * The answers look-ahead considers for an observation and how often each is given. An override
 * for the observation replaces the rulebook's frequencies (values it leaves out count as 0); the
 * result always sums to 1 so that a question whose answers change nothing gains exactly 0.
 */
export function listAnswerOptions(
	observation: Observation,
	overrides?: FrequencyOverrides
): AnswerOption[] {
	const override = overrides?.[observation.key];
	if (override) {
		const overridden = normaliseOptions(
			listDefaultOptions(observation).map((option) => {
				const frequency = override[String(option.value)];
				return {
					value: option.value,
					probability: typeof frequency === 'number' && frequency > 0 ? frequency : 0
				};
			})
		);
		if (overridden) return overridden;
	}
	let options = defaultOptionsCache.get(observation);
	if (!options) {
		const defaults = listDefaultOptions(observation);
		options =
			normaliseOptions(defaults) ??
			defaults.map((option) => ({ ...option, probability: 1 / defaults.length }));
		defaultOptionsCache.set(observation, options);
	}
	return options;
}

// Observations are immutable once an edition is parsed, so their default options can be kept.
const defaultOptionsCache = new WeakMap<Observation, AnswerOption[]>();

export interface LookAheadState {
	/** Answered observations (explicit and matched). Left unchanged when the call returns. */
	facts: FactVector;
	fired: FiredMask;
	logOdds: Float64Array;
}

interface CauseShift {
	causeIndex: number;
	lnLr: number;
}

export interface ObservationLookAhead {
	/** Per answer option (listAnswerOptions order): the summed ln lr, per cause, of the rules
	 * that mention only this observation and fire on that answer. They need no evaluation at
	 * request time: with the observation unanswered they cannot fire, with it answered they
	 * fire whatever else is known. */
	singleFactShifts: CauseShift[][];
	/** Rules that mention this observation and others: evaluated per answer. */
	sharedRules: CompiledRule[];
}

const lookAheadIndexCache = new WeakMap<CompiledRulebook, ObservationLookAhead[]>();

/** Built once per compiled edition. Most rules test one observation, so this saves most of the
 * predicate calls of look-ahead. */
export function prepareLookAhead(compiled: CompiledRulebook): ObservationLookAhead[] {
	const cached = lookAheadIndexCache.get(compiled);
	if (cached) return cached;
	const observationCount = compiled.rulebook.observations.length;
	const index = compiled.rulebook.observations.map((observation, observationIndex) => {
		const rules = (compiled.ruleIndicesByObservation.get(observation.key) ?? []).map(
			(ruleIndex) => compiled.rules[ruleIndex]
		);
		const singleFactRules = rules.filter((rule) => rule.facts.length === 1);
		const probe: FactVector = new Array(observationCount).fill(undefined);
		const singleFactShifts = listDefaultOptions(observation).map((option) => {
			probe[observationIndex] = option.value;
			const byCause = new Map<number, number>();
			for (const rule of singleFactRules) {
				if (rule.predicate(probe)) {
					byCause.set(rule.causeIndex, (byCause.get(rule.causeIndex) ?? 0) + rule.lnLr);
				}
			}
			return [...byCause].map(([causeIndex, lnLr]) => ({ causeIndex, lnLr }));
		});
		return { singleFactShifts, sharedRules: rules.filter((rule) => rule.facts.length > 1) };
	});
	lookAheadIndexCache.set(compiled, index);
	return index;
}

/**
 * Expected entropy reduction of every observation that is neither answered nor excluded, most
 * informative first; only the best `limit` are described and returned (all by default).
 */
export function planNextQuestions(
	compiled: CompiledRulebook,
	state: LookAheadState,
	excluded: ReadonlySet<string>,
	overrides?: FrequencyOverrides,
	limit = Infinity
): NextQuestion[] {
	return describeNextQuestions(
		compiled,
		computeQuestionGains(compiled, state, excluded, overrides),
		limit
	);
}

/**
 * Causes one hypothetical answer moves and by how much, kept as a count over fixed arrays reused
 * for every answer: resetting array lengths in the innermost loop cost more than the arithmetic.
 */
interface ShiftScratch {
	delta: Float64Array;
	isTouched: Uint8Array;
	touched: Int32Array;
	count: number;
}

/** What computeQuestionGains shares with its per-observation steps: read-only but for scratch. */
interface GainWork {
	state: LookAheadState;
	/** Entropy, in bits, of each cause before any hypothetical answer. */
	entropy: Float64Array;
	shifts: ShiftScratch;
	/** Shared rules that can start firing on the current observation (first `liveCount`). */
	live: CompiledRule[];
}

function createShiftScratch(causeCount: number): ShiftScratch {
	return {
		delta: new Float64Array(causeCount),
		isTouched: new Uint8Array(causeCount),
		touched: new Int32Array(causeCount),
		count: 0
	};
}

function addShift(scratch: ShiftScratch, causeIndex: number, lnLr: number) {
	if (scratch.isTouched[causeIndex] === 0) {
		scratch.isTouched[causeIndex] = 1;
		scratch.touched[scratch.count++] = causeIndex;
	}
	scratch.delta[causeIndex] += lnLr;
}

/** Entropy reduction, in bits, of the shifts collected; empties the scratch for the next answer. */
function takeReduction(scratch: ShiftScratch, logOdds: Float64Array, entropy: Float64Array) {
	const { delta, isTouched, touched } = scratch;
	let reduction = 0;
	for (let touchedIndex = 0; touchedIndex < scratch.count; touchedIndex++) {
		const causeIndex = touched[touchedIndex];
		if (delta[causeIndex] !== 0) {
			const after = entropyBitsOfLogOdds(logOdds[causeIndex] + delta[causeIndex]);
			reduction += entropy[causeIndex] - after;
		}
		delta[causeIndex] = 0;
		isTouched[causeIndex] = 0;
	}
	scratch.count = 0;
	return reduction;
}

/**
 * Puts into `live` the shared rules that can start firing on an answer to `observationIndex`:
 * not firing yet (one more answer never stops a rule firing, since no leaf holds on an
 * unanswered observation), and not waiting for some other unanswered observation. Returns how
 * many.
 */
function collectLiveRules(
	sharedRules: readonly CompiledRule[],
	state: LookAheadState,
	observationIndex: number,
	live: CompiledRule[]
): number {
	const { facts, fired } = state;
	let liveCount = 0;
	for (const rule of sharedRules) {
		if (fired[rule.index] === 1) continue;
		let waits = false;
		for (const required of rule.requiredFacts) {
			if (required !== observationIndex && facts[required] === undefined) {
				waits = true;
				break;
			}
		}
		if (!waits) live[liveCount++] = rule;
	}
	return liveCount;
}

/** Expected entropy reduction, in bits, of asking one unanswered observation. */
function expectedGainOf(
	work: GainWork,
	observationIndex: number,
	lookAhead: ObservationLookAhead,
	options: AnswerOption[]
): number {
	const { state, entropy, shifts: scratch, live } = work;
	const { facts } = state;
	const liveCount = collectLiveRules(lookAhead.sharedRules, state, observationIndex, live);
	let expectedGain = 0;
	for (let optionIndex = 0; optionIndex < options.length; optionIndex++) {
		const shifts = lookAhead.singleFactShifts[optionIndex];
		for (let shiftIndex = 0; shiftIndex < shifts.length; shiftIndex++) {
			addShift(scratch, shifts[shiftIndex].causeIndex, shifts[shiftIndex].lnLr);
		}
		if (liveCount > 0) {
			facts[observationIndex] = options[optionIndex].value;
			for (let ruleIndex = 0; ruleIndex < liveCount; ruleIndex++) {
				const rule = live[ruleIndex];
				if (rule.predicate(facts)) addShift(scratch, rule.causeIndex, rule.lnLr);
			}
			facts[observationIndex] = undefined;
		}
		const reduction = takeReduction(scratch, state.logOdds, entropy);
		expectedGain += options[optionIndex].probability * reduction;
	}
	return expectedGain;
}

/**
 * Expected entropy reduction, in bits, per observation (rulebook order); NaN for one that is
 * answered or excluded. Only the rules that mention the observation can change (their effects on
 * one-observation rules are looked up, the others re-evaluated with compiled predicates), and
 * only their causes' log-odds move, so no engine run happens per hypothetical answer.
 */
export function computeQuestionGains(
	compiled: CompiledRulebook,
	state: LookAheadState,
	excluded: ReadonlySet<string>,
	overrides?: FrequencyOverrides
): Float64Array {
	const lookAhead = prepareLookAhead(compiled);
	const observations = compiled.rulebook.observations;
	const causeCount = compiled.causes.length;
	const entropy = new Float64Array(causeCount);
	for (let causeIndex = 0; causeIndex < causeCount; causeIndex++) {
		entropy[causeIndex] = entropyBitsOfLogOdds(state.logOdds[causeIndex]);
	}
	const work: GainWork = { state, entropy, shifts: createShiftScratch(causeCount), live: [] };
	const gains = new Float64Array(observations.length).fill(Number.NaN);
	for (let observationIndex = 0; observationIndex < observations.length; observationIndex++) {
		const observation = observations[observationIndex];
		if (state.facts[observationIndex] !== undefined || excluded.has(observation.key)) continue;
		const options = listAnswerOptions(observation, overrides);
		gains[observationIndex] = expectedGainOf(
			work,
			observationIndex,
			lookAhead[observationIndex],
			options
		);
	}
	return gains;
}

/** The questions of `computeQuestionGains`, most informative first, the best `limit` described;
 * `lowValue` (observation indices) marks those not worth their time. */
export function describeNextQuestions(
	compiled: CompiledRulebook,
	gains: Float64Array,
	limit = Infinity,
	lowValue?: ReadonlySet<number>
): NextQuestion[] {
	const observations = compiled.rulebook.observations;
	const asked: number[] = [];
	const shownGains = new Float64Array(observations.length);
	for (let observationIndex = 0; observationIndex < observations.length; observationIndex++) {
		if (Number.isNaN(gains[observationIndex])) continue;
		shownGains[observationIndex] = roundGainBits(gains[observationIndex]);
		asked.push(observationIndex);
	}
	// Order by what the caller will see (4 decimals), so equal shown gains list by key.
	asked.sort((a, b) => {
		if (shownGains[a] !== shownGains[b]) return shownGains[b] - shownGains[a];
		return compareKeys(observations[a].key, observations[b].key);
	});
	const count = Math.min(asked.length, limit);
	const questions: NextQuestion[] = new Array(count);
	for (let rank = 0; rank < count; rank++) {
		const observationIndex = asked[rank];
		questions[rank] = describeQuestion(observations[observationIndex], gains[observationIndex]);
		if (lowValue) questions[rank].lowValue = lowValue.has(observationIndex);
	}
	return questions;
}

/** The gain as a response shows it: questions are ordered by what the caller will see. */
export function roundGainBits(gain: number): number {
	return roundTo(gain, GAIN_DECIMALS);
}

function describeQuestion(observation: Observation, expectedGain: number): NextQuestion {
	const question: NextQuestion = {
		key: observation.key,
		prompt: observation.prompt,
		expectedGain,
		kind: observation.kind,
		group: observation.group,
		cautions: observation.cautions
	};
	if (observation.help) question.help = observation.help;
	if (observation.kind === 'enum') {
		question.values = observation.values;
		if (observation.valueLabels) question.valueLabels = observation.valueLabels;
	}
	if (observation.kind === 'number') {
		question.unit = observation.unit;
		question.min = observation.min;
		question.max = observation.max;
		question.bins = observation.bins;
	}
	return question;
}
