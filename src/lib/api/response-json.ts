/**
 * JSON of a diagnosis response without serialising the edition's unchanging text (names, prompts,
 * rationales, cautions, equipment) on every request.
 *
 * Each cause, question and test is written from a template made the first time it is met: the
 * item's own JSON with its per-request fields (probability, gain, targets…) cut out. Fired rules'
 * evidence is kept whole. The text is plain ASCII, every other character written as a \u escape
 * (RFC 8259, section 7), so it is its own UTF-8 encoding and needs no encoder: for a 20 KB answer,
 * encoding costs more than writing. A serializer belongs to one edition, whose text never
 * changes; `tests/unit/diagnosis/response-json.spec.ts` checks it against `JSON.stringify` on
 * random answers.
 */

type Item = Record<string, unknown>;

/** Fields that change from one request to the next, per list of the response. */
const VARYING_FIELDS = {
	causes: ['probability', 'band', 'evidence'],
	nextQuestions: ['expectedGain', 'lowValue'],
	tests: ['targets', 'priority', 'score']
} as const;

type ListName = keyof typeof VARYING_FIELDS;

/** Lists of the edition's own strings (cause keys, cautions): each string's JSON is kept. */
const EDITION_STRING_LISTS = new Set(['targets', 'cautions']);
const MAX_KEPT_STRINGS = 10_000;

interface Template {
	/** JSON text around the varying fields: one more piece than fields. */
	pieces: string[];
	fields: string[];
}

const NON_ASCII = /[\u0080-\uffff]/g;
const escapeCodeUnit = (char: string) => `\\u${char.charCodeAt(0).toString(16).padStart(4, '0')}`;

/** `JSON.stringify`, with every non-ASCII code unit escaped. */
export function toAsciiJson(value: unknown): string {
	const json = JSON.stringify(value);
	NON_ASCII.lastIndex = 0;
	return NON_ASCII.test(json) ? json.replace(NON_ASCII, escapeCodeUnit) : json;
}

const HOLE = '\u0000varies\u0000';
const HOLE_JSON = JSON.stringify(HOLE);

function makeTemplate(item: Item, varying: readonly string[]): Template {
	const copy: Item = { ...item };
	const fields = Object.keys(copy).filter((key) => varying.includes(key));
	for (const field of fields) copy[field] = HOLE;
	return { pieces: toAsciiJson(copy).split(HOLE_JSON), fields };
}

export interface ResponseSerializer {
	/** The response as ASCII JSON text: `JSON.parse` gives back the same value, keys in order. */
	stringify(response: Item): string;
}

/** What one edition's serializer keeps between requests: templates and the JSON of its text. */
interface SerializerCache {
	templates: Record<ListName, Map<string, Template>>;
	/** Fired rules' evidence, by rule key. */
	evidenceJson: Map<string, string>;
	/** Strings of EDITION_STRING_LISTS, at most MAX_KEPT_STRINGS of them. */
	stringJson: Map<string, string>;
}

function writeStrings(cache: SerializerCache, values: unknown[]): string {
	const { stringJson } = cache;
	let out = '[';
	for (let index = 0; index < values.length; index++) {
		const value = values[index];
		let json = typeof value === 'string' ? stringJson.get(value) : undefined;
		if (json === undefined) {
			json = toAsciiJson(value);
			if (typeof value === 'string') {
				if (stringJson.size >= MAX_KEPT_STRINGS) stringJson.clear();
				stringJson.set(value, json);
			}
		}
		out += index === 0 ? json : `,${json}`;
	}
	return `${out}]`;
}

function writeEvidence(cache: SerializerCache, value: unknown[]): string {
	let out = '[';
	for (let index = 0; index < value.length; index++) {
		const evidence = value[index] as Item;
		const rule = String(evidence.rule);
		let json = cache.evidenceJson.get(rule);
		if (json === undefined) cache.evidenceJson.set(rule, (json = toAsciiJson(evidence)));
		out += index === 0 ? json : `,${json}`;
	}
	return `${out}]`;
}

function writeValue(cache: SerializerCache, field: string, value: unknown): string {
	if (field === 'evidence' && Array.isArray(value)) return writeEvidence(cache, value);
	// Numbers are most of what varies; their JSON is their ASCII text.
	if (typeof value === 'number') return Number.isFinite(value) ? String(value) : 'null';
	if (EDITION_STRING_LISTS.has(field) && Array.isArray(value)) return writeStrings(cache, value);
	return toAsciiJson(value);
}

function writeList(cache: SerializerCache, name: ListName, items: Item[]): string {
	let out = '[';
	for (let index = 0; index < items.length; index++) {
		const item = items[index];
		// Optional fields (a test's steps) change the template.
		const id = name === 'tests' && item.steps ? `${item.key}+steps` : String(item.key);
		let template = cache.templates[name].get(id);
		if (!template) {
			template = makeTemplate(item, VARYING_FIELDS[name]);
			cache.templates[name].set(id, template);
		}
		let json = template.pieces[0];
		for (let field = 0; field < template.fields.length; field++) {
			const key = template.fields[field];
			json += writeValue(cache, key, item[key]) + template.pieces[field + 1];
		}
		out += index === 0 ? json : `,${json}`;
	}
	return `${out}]`;
}

function writeResponse(cache: SerializerCache, response: Item): string {
	let out = '';
	for (const key of Object.keys(response)) {
		const value = response[key];
		if (value === undefined) continue;
		const json =
			key in VARYING_FIELDS && Array.isArray(value)
				? writeList(cache, key as ListName, value as Item[])
				: writeValue(cache, key, value);
		out += `${out ? ',' : '{'}${toAsciiJson(key)}:${json}`;
	}
	return out ? `${out}}` : '{}';
}

export function createResponseSerializer(): ResponseSerializer {
	const cache: SerializerCache = {
		templates: { causes: new Map(), nextQuestions: new Map(), tests: new Map() },
		evidenceJson: new Map(),
		stringJson: new Map()
	};
	return { stringify: (response) => writeResponse(cache, response) };
}
