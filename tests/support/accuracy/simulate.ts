// Seeded simulated cars drawn from answer profiles, with missing and wrong answers and optional second faults.
import {
	listAnswerKeys,
	type Observation,
	type ObservationValue,
	type Rulebook
} from '../../../src/lib/diagnosis/schema';
import type { AnswerDistribution, ProfileSet } from './profiles';

export type Random = () => number;

/** A deterministic generator (mulberry32), so every run measures the same cars. */
export function createRandom(seed: number): Random {
	let state = seed | 0;
	return () => {
		state = (state + 0x6d2b79f5) | 0;
		let t = Math.imul(state ^ (state >>> 15), 1 | state);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

export interface NoiseModel {
	name: string;
	/** Share of answers the technician or customer cannot give. */
	missingRate: number;
	/** Share of the given answers that are wrong. */
	wrongRate: number;
	/** How a wrong answer is chosen: any other answer alike, or the other answers in proportion
	 * to how common they are (the rulebook's base frequencies). */
	wrongAnswers: 'uniform' | 'common';
	/** Share of cars with a second fault beside the first. */
	secondFaultRate: number;
}

export interface SimulatedCar {
	/** The car's faults, the first drawn by the causes' priors. */
	faults: string[];
	/** The answer a person gives to each observation, wrong ones included. */
	reported: Record<string, ObservationValue>;
	/** Observations the person cannot answer when asked (test results are always had). */
	missing: Set<string>;
}

export function draw(distribution: Readonly<Record<string, number>>, random: Random): string {
	const keys = Object.keys(distribution);
	let left = random();
	for (const key of keys) {
		left -= distribution[key];
		if (left < 0) return key;
	}
	return keys[keys.length - 1];
}

/** The chance that `observed` is reported when `actual` is the truth and the answer is wrong. */
export function wrongAnswerChance(
	observation: Observation,
	noise: NoiseModel,
	actual: string,
	observed: string
): number {
	if (actual === observed) return 0;
	const keys = listAnswerKeys(observation);
	if (noise.wrongAnswers === 'uniform') return 1 / (keys.length - 1);
	const frequency = (key: string) => frequencyOf(observation, key);
	const others = keys.reduce((sum, key) => (key === actual ? sum : sum + frequency(key)), 0);
	return others > 0 ? frequency(observed) / others : 1 / (keys.length - 1);
}

function frequencyOf(observation: Observation, key: string): number {
	if (observation.kind === 'number') {
		return observation.bins.find((bin) => String(bin.value) === key)?.frequency ?? 0;
	}
	return observation.frequencies[key] ?? 0;
}

function misreport(observation: Observation, noise: NoiseModel, actual: string, random: Random) {
	const keys = listAnswerKeys(observation);
	const chances = Object.fromEntries(
		keys.map((key) => [key, wrongAnswerChance(observation, noise, actual, key)])
	);
	return draw(chances, random);
}

/** A number inside the bin: within half-way to the neighbouring bins' midpoints, so it reads
 * back as that bin and stays inside the observation's range. */
export function sampleInBin(observation: Observation, key: string, random: Random): number {
	if (observation.kind !== 'number') throw new Error(`${observation.key} is not a number`);
	const values = observation.bins.map((bin) => bin.value).sort((a, b) => a - b);
	const value = Number(key);
	const index = values.indexOf(value);
	const below = index > 0 ? (value - values[index - 1]) / 4 : 0;
	const above = index < values.length - 1 ? (values[index + 1] - value) / 4 : below;
	const low = Math.max(observation.min, value - (index > 0 ? below : 0));
	const high = Math.min(observation.max, value + (index < values.length - 1 ? above : below));
	const sampled = low + (high - low) * random();
	return Math.round(sampled * 10) / 10;
}

/** The bin an answered number falls in (the nearest bin value). */
export function binOf(observation: Observation, value: number): string {
	if (observation.kind !== 'number') throw new Error(`${observation.key} is not a number`);
	let best = observation.bins[0].value;
	for (const bin of observation.bins) {
		if (Math.abs(bin.value - value) < Math.abs(best - value)) best = bin.value;
	}
	return String(best);
}

export function toValue(observation: Observation, key: string, random: Random): ObservationValue {
	if (observation.kind === 'boolean') return key === 'true';
	if (observation.kind === 'enum') return key;
	return sampleInBin(observation, key, random);
}

/** How far a fault's answers to an observation lie from the average car's (total variation):
 * with two faults, the one that marks an observation more shows through in it. */
function distinctness(distribution: AnswerDistribution, average: AnswerDistribution): number {
	let total = 0;
	for (const key of Object.keys(average)) total += Math.abs(distribution[key] - average[key]);
	return total / 2;
}

function averageDistributions(rulebook: Rulebook, profiles: ProfileSet) {
	const averages = new Map<string, AnswerDistribution>();
	for (const observation of rulebook.observations) {
		const average: AnswerDistribution = {};
		for (const key of listAnswerKeys(observation)) average[key] = 0;
		for (const cause of rulebook.causes) {
			const distribution = profiles.table.get(cause.key)!.get(observation.key)!;
			for (const key of Object.keys(average)) average[key] += cause.prior * distribution[key];
		}
		averages.set(observation.key, average);
	}
	return averages;
}

export function simulateCars(
	rulebook: Rulebook,
	profiles: ProfileSet,
	noise: NoiseModel,
	count: number,
	seed: number
): SimulatedCar[] {
	const random = createRandom(seed);
	const priors = Object.fromEntries(rulebook.causes.map((cause) => [cause.key, cause.prior]));
	const averages = averageDistributions(rulebook, profiles);
	return Array.from({ length: count }, () => {
		const faults = [draw(priors, random)];
		if (random() < noise.secondFaultRate) {
			const rest = { ...priors, [faults[0]]: 0 };
			faults.push(draw(rest, random));
		}
		const reported: SimulatedCar['reported'] = {};
		const missing = new Set<string>();
		for (const observation of rulebook.observations) {
			const rows = faults.map((key) => profiles.table.get(key)!.get(observation.key)!);
			const average = averages.get(observation.key)!;
			const shown = rows.reduce((a, b) =>
				distinctness(b, average) > distinctness(a, average) ? b : a
			);
			let key = draw(shown, random);
			if (random() < noise.missingRate && observation.group !== 'test_result') {
				missing.add(observation.key);
			}
			if (random() < noise.wrongRate) key = misreport(observation, noise, key, random);
			reported[observation.key] = toValue(observation, key, random);
		}
		return { faults, reported, missing };
	});
}
