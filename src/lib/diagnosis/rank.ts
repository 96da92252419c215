// Ranking causes: posterior probability from the fired rules, bands and a stable order.
import type { CompiledRulebook, FiredMask } from './evaluate';
import type { Band, Bands } from './schema';

export interface Evidence {
	rule: string;
	lr: number;
	because: string;
	source: string;
}

export interface RankedCause {
	key: string;
	name: string;
	/** Full precision; rounded only when a response is built. */
	probability: number;
	band: Band;
	logOdds: number;
	evidence: Evidence[];
}

export function logistic(logOdds: number): number {
	// Both branches avoid overflow of exp() for large |logOdds|.
	if (logOdds >= 0) return 1 / (1 + Math.exp(-logOdds));
	const odds = Math.exp(logOdds);
	return odds / (1 + odds);
}

export function assignBand(probability: number, bands: Bands): Band {
	if (probability >= bands.likely) return 'likely';
	if (probability >= bands.possible) return 'possible';
	return 'unlikely';
}

/** Posterior log-odds per cause: prior log-odds plus ln(lr) of each fired rule of that cause. */
export function sumLogOdds(compiled: CompiledRulebook, fired: FiredMask): Float64Array {
	const logOdds = Float64Array.from(compiled.priorLogOdds);
	for (const rule of compiled.rules) {
		if (fired[rule.index] === 1) logOdds[rule.causeIndex] += rule.lnLr;
	}
	return logOdds;
}

export function rankCauses(
	compiled: CompiledRulebook,
	fired: FiredMask,
	logOdds: Float64Array = sumLogOdds(compiled, fired)
): RankedCause[] {
	const evidenceByCause: Evidence[][] = compiled.causes.map(() => []);
	for (const rule of compiled.rules) {
		if (fired[rule.index] === 1) evidenceByCause[rule.causeIndex].push(rule.evidence);
	}
	const bands = compiled.rulebook.meta.bands;
	const ranked = compiled.causes.map((cause, index): RankedCause => {
		const probability = logistic(logOdds[index]);
		return {
			key: cause.key,
			name: cause.name,
			probability,
			band: assignBand(probability, bands),
			logOdds: logOdds[index],
			evidence: evidenceByCause[index].sort(compareEvidence)
		};
	});
	return ranked.sort(compareRankedCauses);
}

function compareEvidence(a: Evidence, b: Evidence): number {
	// |ln lr| ordered without logarithms: lr and 1/lr weigh the same.
	const weight = Math.max(b.lr, 1 / b.lr) - Math.max(a.lr, 1 / a.lr);
	if (weight !== 0) return weight;
	return compareKeys(a.rule, b.rule);
}

function compareRankedCauses(a: RankedCause, b: RankedCause): number {
	if (a.probability !== b.probability) return b.probability - a.probability;
	return compareKeys(a.key, b.key);
}

/** Plain code-unit order, so the result never depends on the server's locale. */
export function compareKeys(a: string, b: string): number {
	return a < b ? -1 : a > b ? 1 : 0;
}
