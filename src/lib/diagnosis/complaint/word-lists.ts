// Word lists the complaint matcher reads by: negations, contractions, doubts, conjunctions, little words.

export const NEGATIONS: ReadonlySet<string> = new Set([
	'no',
	'not',
	'never',
	'without',
	'nor',
	'none',
	'nothing',
	'neither'
]);
/** "doesn't", "cant": the verb and a separate "not", so "fan doesn't come on" meets the phrase
 * "fan does not come on". Customers often leave the apostrophe out. */
export const VERBS_BEFORE_NT: ReadonlyMap<string, string> = new Map([
	['ca', 'can'],
	['wo', 'will'],
	['ai', 'is'],
	['sha', 'shall']
]);
export const NEGATED_VERBS_WITHOUT_APOSTROPHE: ReadonlyMap<string, string> = new Map([
	['doesnt', 'does'],
	['dont', 'do'],
	['didnt', 'did'],
	['isnt', 'is'],
	['arent', 'are'],
	['wasnt', 'was'],
	['werent', 'were'],
	['wont', 'will'],
	['cant', 'can'],
	['cannot', 'can'],
	['couldnt', 'could'],
	['wouldnt', 'would'],
	['shouldnt', 'should'],
	['hasnt', 'has'],
	['havent', 'have'],
	['hadnt', 'had'],
	['aint', 'is']
]);
/** After a negation these make it a doubt, not a denial: "not sure if the fan comes on". */
export const HEDGES: ReadonlySet<string> = new Set([
	'sure',
	'certain',
	'know',
	'idea',
	'clue',
	'remember'
]);
/** After a negation this speaks of the past, which denies nothing now: "it never used to". */
export const PAST_HABITS: ReadonlySet<string> = new Set(['used']);
/** A doubt reaches a phrase only through one of these: "don't know if …" (but "can't tell where
 * it is leaking from" is a statement). */
export const DOUBT_OPENERS: ReadonlySet<string> = new Set(['if', 'whether']);
export const CONJUNCTIONS: ReadonlySet<string> = new Set([
	'and',
	'but',
	'although',
	'though',
	'however',
	'whereas'
]);
/** Little words count for a quarter: they may differ without changing what was said. */
export const LITTLE_WORDS: ReadonlySet<string> = new Set([
	'a',
	'an',
	'the',
	'in',
	'on',
	'at',
	'of',
	'to',
	'up',
	'it',
	'its',
	"it's",
	'is',
	'was',
	'are',
	'be',
	'been',
	'my',
	'i',
	'me',
	'we',
	'our',
	'out',
	'when',
	'from',
	'with',
	'for',
	'this',
	'that',
	'there',
	'some',
	'any',
	'all',
	'just',
	'very',
	'really',
	'got',
	'get',
	'gets',
	'keeps',
	'still',
	'do',
	'does',
	'did',
	'has',
	'have',
	'had',
	'will',
	'would',
	'can',
	'could',
	'should',
	'am',
	'were',
	'being',
	'under',
	'into',
	'onto',
	'by',
	'as',
	'also',
	'even',
	'if',
	'they',
	'you',
	'your',
	'he',
	'she',
	'his',
	'her',
	'them',
	'which'
]);
export const LITTLE_WORD_WEIGHT = 0.25;

/** Misspelt negated verbs customers write ("dosent"), each as its verb; "not" follows. */
export const MISSPELT_NEGATED_VERBS: ReadonlyMap<string, string> = new Map([
	['dosent', 'does'],
	['dosnt', 'does'],
	['doesent', 'does'],
	['dosen', 'does'],
	['didint', 'did'],
	['dident', 'did'],
	['didnot', 'did'],
	['isint', 'is'],
	['wasint', 'was'],
	['wouldint', 'would'],
	['havnt', 'have'],
	['hasent', 'has'],
	['wount', 'will']
]);
/** Past tenses the stemmer's endings do not reach, as the verb they come from. */
export const IRREGULAR_VERBS: ReadonlyMap<string, string> = new Map([
	['came', 'come'],
	['went', 'go'],
	['ran', 'run'],
	['blew', 'blow'],
	['blown', 'blow'],
	['kept', 'keep'],
	['froze', 'freeze'],
	['frozen', 'freeze'],
	['broke', 'break'],
	['broken', 'break'],
	['began', 'begin'],
	['shot', 'shoot'],
	['grew', 'grow'],
	['threw', 'throw']
]);
/** Words that make what follows (or goes before) in the clause a guess, not an answer:
 * "I think the fan comes on", "maybe it's losing water". */
export const DOUBT_WORDS: ReadonlySet<string> = new Set([
	'maybe',
	'perhaps',
	'possibly',
	'probably',
	'might',
	'think',
	'guess',
	'suppose',
	'reckon',
	'unsure'
]);
/** Degree words after a yes reading that make it a late or weak one: "the fan comes on late"
 * is no "the fan runs when hot: yes". ("slow" only as "slow to": "slow traffic" is a place.) */
export const PARTIAL_WORDS: ReadonlySet<string> = new Set([
	'late',
	'later',
	'eventually',
	'finally',
	'barely',
	'weak',
	'weakly',
	'already',
	'struggles'
]);
