// Per-cause answer profiles for simulated cars: reads both profile shapes, checks them against the rulebook's vocabulary.
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { listAnswerKeys, type Observation, type Rulebook } from '../../../src/lib/diagnosis/schema';

/** P(answer key | cause) for one observation; answer keys as in `listAnswerKeys`. */
export type AnswerDistribution = Record<string, number>;

export interface ProfileSet {
	name: string;
	source: string;
	/** cause key → observation key → distribution; every cause and observation of the rulebook. */
	table: Map<string, Map<string, AnswerDistribution>>;
}

/** Profiles are hand-written: a row may miss 1 by rounding, not by more. */
const SUM_TOLERANCE = 0.011;

const probability = z.number().min(0).max(1);
const distributionSchema = z.union([probability, z.record(z.string(), probability)]);
const rowSchema = z.record(z.string(), distributionSchema);

const perCauseSchema = z.strictObject({
	name: z.string().min(1),
	about: z.string().min(1),
	source: z.string().min(1),
	background: rowSchema,
	causes: z.record(z.string(), rowSchema)
});

const perObservationSchema = z.strictObject({
	name: z.string().min(1),
	about: z.string().min(1),
	source: z.string().min(1),
	groups: z.record(z.string().regex(/^@/), z.array(z.string()).min(1)),
	observations: z.record(
		z.string(),
		z.strictObject({
			others: distributionSchema,
			byCause: z.record(z.string(), distributionSchema)
		})
	)
});

type Written = z.infer<typeof distributionSchema>;

/** A boolean written as P(true), or an object over answer keys, as a checked distribution. */
function toDistribution(observation: Observation, written: Written, where: string) {
	const keys = listAnswerKeys(observation);
	const distribution: AnswerDistribution =
		typeof written === 'number'
			? observation.kind === 'boolean'
				? { true: written, false: 1 - written }
				: fail(`${where}: ${observation.key} is not yes/no; give a value per answer`)
			: { ...written };
	for (const key of Object.keys(distribution)) {
		if (!keys.includes(key)) fail(`${where}: "${key}" is not an answer of ${observation.key}`);
	}
	const total = keys.reduce((sum, key) => sum + (distribution[key] ?? 0), 0);
	if (Math.abs(total - 1) > SUM_TOLERANCE) fail(`${where}: ${observation.key} sums to ${total}`);
	return Object.fromEntries(keys.map((key) => [key, (distribution[key] ?? 0) / total]));
}

function fail(message: string): never {
	throw new Error(`answer profile: ${message}`);
}

function indexObservations(rulebook: Rulebook) {
	return new Map(rulebook.observations.map((observation) => [observation.key, observation]));
}

function readPerCause(raw: z.infer<typeof perCauseSchema>, rulebook: Rulebook): ProfileSet {
	const observations = indexObservations(rulebook);
	const known = (key: string, where: string) =>
		observations.get(key) ?? fail(`${where}: unknown observation "${key}"`);
	for (const key of Object.keys(raw.causes)) {
		if (!rulebook.causes.some((cause) => cause.key === key)) fail(`unknown cause "${key}"`);
	}
	const table = new Map<string, Map<string, AnswerDistribution>>();
	for (const cause of rulebook.causes) {
		const row = raw.causes[cause.key] ?? fail(`no profile for cause "${cause.key}"`);
		for (const key of Object.keys(row)) known(key, cause.key);
		const byObservation = new Map<string, AnswerDistribution>();
		for (const observation of rulebook.observations) {
			const written = row[observation.key] ?? raw.background[observation.key];
			if (written === undefined) fail(`background: no row for ${observation.key}`);
			byObservation.set(observation.key, toDistribution(observation, written, cause.key));
		}
		table.set(cause.key, byObservation);
	}
	return { name: raw.name, source: raw.source, table };
}

function readPerObservation(
	raw: z.infer<typeof perObservationSchema>,
	rulebook: Rulebook
): ProfileSet {
	const causeKeys = rulebook.causes.map((cause) => cause.key);
	const expand = (key: string) =>
		key.startsWith('@') ? (raw.groups[key] ?? fail(`unknown group "${key}"`)) : [key];
	for (const members of Object.values(raw.groups)) {
		for (const key of members) if (!causeKeys.includes(key)) fail(`unknown cause "${key}"`);
	}
	const table = new Map(causeKeys.map((key) => [key, new Map<string, AnswerDistribution>()]));
	for (const observation of rulebook.observations) {
		const row = raw.observations[observation.key] ?? fail(`no row for ${observation.key}`);
		for (const key of causeKeys) {
			table.get(key)!.set(observation.key, toDistribution(observation, row.others, 'others'));
		}
		for (const [written, distribution] of Object.entries(row.byCause)) {
			for (const key of expand(written)) {
				if (!causeKeys.includes(key)) fail(`${observation.key}: unknown cause "${key}"`);
				table.get(key)!.set(observation.key, toDistribution(observation, distribution, key));
			}
		}
	}
	for (const key of Object.keys(raw.observations)) {
		if (!rulebook.observations.some((observation) => observation.key === key)) {
			fail(`unknown observation "${key}"`);
		}
	}
	return { name: raw.name, source: raw.source, table };
}

/** Parses a profile file of either shape (per cause with a background row, or per observation). */
export function parseProfiles(json: unknown, rulebook: Rulebook): ProfileSet {
	const perCause = perCauseSchema.safeParse(json);
	if (perCause.success) return readPerCause(perCause.data, rulebook);
	const perObservation = perObservationSchema.safeParse(json);
	if (perObservation.success) return readPerObservation(perObservation.data, rulebook);
	return fail(z.prettifyError(perCause.error));
}

export function loadProfiles(path: string, rulebook: Rulebook): ProfileSet {
	return parseProfiles(JSON.parse(readFileSync(path, 'utf8')), rulebook);
}
