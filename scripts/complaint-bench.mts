// Complaint matching cost and matches: time per complaint and a digest of the matches on 4,000
// seeded complaints made from the shipped phrases (misspellings, filler, negations, joins).
// Run: node --import tsx scripts/complaint-bench.mts; BENCH_COMPLAINT_OUT=file keeps every match.
import { writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { createDiagnoser, type Rulebook } from '../src/lib/diagnosis';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';

const COUNT = Number(process.env.BENCH_COMPLAINTS ?? 4000);

/** A deterministic pseudo-random generator, so every run measures the same complaints. */
function mulberry32(seed: number) {
	return () => {
		seed |= 0;
		seed = (seed + 0x6d2b79f5) | 0;
		let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const FILLERS = [
	'my car',
	'to be honest',
	'since last week',
	'every morning',
	'the wife says',
	'on the way to work',
	'i think',
	'after the school run'
];
const JOINS = [' and ', ', ', ' but ', '. ', ' also '];
const LETTERS = 'abcdefghijklmnopqrstuvwxyz';

/** One typo in a word of five letters or more: a dropped, doubled, swapped or changed letter. */
function misspell(word: string, random: () => number): string {
	if (word.length < 5) return word;
	const at = 1 + Math.floor(random() * (word.length - 2));
	const kind = Math.floor(random() * 4);
	if (kind === 0) return word.slice(0, at) + word.slice(at + 1);
	if (kind === 1) return word.slice(0, at) + word[at] + word.slice(at);
	if (kind === 2) return word.slice(0, at) + word[at + 1] + word[at] + word.slice(at + 2);
	return word.slice(0, at) + LETTERS[Math.floor(random() * 26)] + word.slice(at + 1);
}

type Expected = { key: string; value: unknown };
interface Generated {
	text: string;
	/** What each clause says: its phrase's answer, turned round when a boolean is negated. */
	expected: Expected[];
}

function makeComplaints(rulebook: Rulebook, count: number, seed = 13): Generated[] {
	const random = mulberry32(seed);
	const phrases = rulebook.observations.flatMap((o) =>
		o.phrases.map((p) => ({ text: p.text, key: o.key, kind: o.kind, value: p.value }))
	);
	const pick = <T,>(items: readonly T[]) => items[Math.floor(random() * items.length)];
	return Array.from({ length: count }, () => {
		const parts: string[] = [];
		const expected: Expected[] = [];
		const clauses = 1 + Math.floor(random() * 4);
		for (let i = 0; i < clauses; i++) {
			const phrase = pick(phrases);
			let words = phrase.text.split(' ');
			if (random() < 0.4) words = words.map((w) => (random() < 0.25 ? misspell(w, random) : w));
			const negated = random() < 0.15;
			if (negated) words.unshift(pick(['no', 'not', 'never']));
			const filler = random() < 0.3 ? pick(FILLERS) : '';
			if (filler) words.unshift(...filler.split(' '));
			parts.push(words.join(' '));
			// "i think" makes the clause a guess, which answers nothing.
			if (filler === 'i think') continue;
			if (!negated) expected.push({ key: phrase.key, value: phrase.value });
			else if (phrase.kind === 'boolean') expected.push({ key: phrase.key, value: !phrase.value });
		}
		const text = parts.reduce((all, part, i) => (i === 0 ? part : all + pick(JOINS) + part), '');
		return { text, expected };
	});
}

const rulebook = loadRulebookFromDir('rules');
const diagnoser = createDiagnoser(rulebook);
const generated = makeComplaints(rulebook, COUNT);
const complaints = generated.map((item) => item.text);

const cold = performance.now();
const results = complaints.map((text) => diagnoser.matchComplaint(text));
const coldUs = ((performance.now() - cold) * 1000) / COUNT;
const passes: number[] = [];
for (let pass = 0; pass < 3; pass++) {
	const start = performance.now();
	for (const text of complaints) diagnoser.matchComplaint(text);
	passes.push(((performance.now() - start) * 1000) / COUNT);
}
passes.sort((a, b) => a - b);
const matchCount = results.reduce((sum, r) => sum + r.length, 0);
// Clause answers found (key and value), and matches that no clause said. A clause's phrase may
// be a near twin of another observation's, so neither figure reaches its ideal: they compare
// one version of the matcher with another.
let found = 0;
let said = 0;
let unsaid = 0;
generated.forEach(({ expected }, i) => {
	said += expected.length;
	found += expected.filter((e) =>
		results[i].some((m) => m.key === e.key && m.value === e.value)
	).length;
	unsaid += results[i].filter((m) => !expected.some((e) => e.key === m.key)).length;
});
const digest = createHash('sha256').update(JSON.stringify(results)).digest('hex').slice(0, 16);
console.table({
	complaints: COUNT,
	'matches in all': matchCount,
	'complaints with a match': results.filter((r) => r.length > 0).length,
	'clause answers found': `${found}/${said} (${((100 * found) / said).toFixed(1)} %)`,
	'matches of an observation no clause named': unsaid,
	'µs per complaint, first pass (fuse.js searches unknown words)': Math.round(coldUs),
	'µs per complaint, warm (median of 3)': Math.round(passes[1]),
	'digest of every match': digest
});
if (process.env.BENCH_COMPLAINT_OUT) {
	writeFileSync(
		process.env.BENCH_COMPLAINT_OUT,
		JSON.stringify(
			generated.map(({ text, expected }, i) => ({ text, expected, matched: results[i] })),
			null,
			1
		)
	);
}
