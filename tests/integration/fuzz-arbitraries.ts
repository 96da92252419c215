// Random and hostile request bodies for the fuzz test: JSON text shaped by a JSON Schema (so it
// reaches past "unknown field" into the code behind) with hostile values in every place, and form
// bodies in every encoding a client might send, broken ones included.
import fc from 'fast-check';

export const PROTOTYPE_KEYS = [
	'__proto__',
	'constructor',
	'prototype',
	'toString',
	'hasOwnProperty'
];

/** Numbers a person might type: most fields get one, so a single extreme one elsewhere reaches
 * the arithmetic instead of being refused with the others. */
const plainNumberText = fc.constantFrom(
	'0.5',
	'1',
	'2',
	'5',
	'10',
	'20',
	'50',
	'80',
	'100',
	'1000',
	'160000'
);

/** Extreme numbers as JSON text: what JSON.stringify cannot write (1e999 parses to Infinity) included. */
const extremeNumberText = fc.oneof(
	{
		weight: 3,
		arbitrary: fc.constantFrom(
			'1e308',
			'-1e308',
			'1e999',
			'-1e999',
			'1e17',
			'1e21',
			'-1e21',
			'1e12',
			'1e-9',
			'5e-324',
			'1e-300',
			'-0',
			'0',
			'9007199254740993',
			'-9007199254740993',
			'-1'
		)
	},
	{ weight: 1, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }).map(String) },
	{ weight: 1, arbitrary: fc.integer().map(String) }
);

export const numberText = fc.oneof(
	{ weight: 2, arbitrary: plainNumberText },
	{ weight: 1, arbitrary: extremeNumberText }
);

export const hostileString = fc.oneof(
	fc.string({ maxLength: 40 }),
	fc.string({ unit: 'binary', maxLength: 40 }),
	fc.constantFrom(
		'',
		' ',
		'\u0000',
		'\u0007\u001b[2J',
		'\r\n\r\n',
		'\u202e\u0301',
		'\ud800',
		'NaN',
		'Infinity',
		'-1e308',
		'1e17',
		'50,5',
		'0x1F',
		'2026-02-30',
		'<script>alert(1)</script>',
		"' OR 1=1 --",
		'../../etc/passwd',
		'%00',
		'%E0%A4%A',
		'x'.repeat(3000),
		...PROTOTYPE_KEYS
	)
);

/** Dates as a date field takes them, real and edge ones (a pattern only says "dddd-dd-dd"). */
const DATES = ['2026-12-02', '2020-02-29', '1900-01-01', '0001-01-01', '9999-12-31', '2026-02-30'];

/** A value the server has shown (a select's option, an enum, an observation's value) or a hostile one. */
const stringFrom = (seen: readonly string[]) =>
	seen.length
		? fc.oneof(
				{ weight: 3, arbitrary: fc.constantFrom(...seen) },
				{ weight: 1, arbitrary: hostileString },
				{ weight: 1, arbitrary: fc.constantFrom(...PROTOTYPE_KEYS) }
			)
		: hostileString;

const keyFrom = (keys: readonly string[]) =>
	fc.oneof(
		{ weight: 4, arbitrary: keys.length ? fc.constantFrom(...keys) : fc.string() },
		{ weight: 1, arbitrary: fc.constantFrom(...PROTOTYPE_KEYS) },
		{ weight: 1, arbitrary: hostileString }
	);

const objectText = (pairs: [string, string][]) =>
	`{${pairs.map(([key, value]) => `${JSON.stringify(key)}:${value}`).join(',')}}`;

/** Any JSON value as text, with object keys drawn from `keys` and strings from `seen`. */
export function anyJsonText(
	keys: readonly string[],
	seen: readonly string[]
): fc.Arbitrary<string> {
	const { value } = fc.letrec<{ value: string }>((tie) => ({
		value: fc.oneof(
			{ depthSize: 'small', withCrossShrink: true },
			numberText,
			stringFrom(seen).map((s) => JSON.stringify(s)),
			fc.constantFrom('true', 'false', 'null'),
			fc.array(tie('value'), { maxLength: 4 }).map((items) => `[${items.join(',')}]`),
			fc.array(fc.tuple(keyFrom(keys), tie('value')), { maxLength: 5 }).map(objectText)
		)
	}));
	return value;
}

/** Texts that are not JSON, or JSON that no endpoint expects. */
const brokenJsonText = fc.constantFrom(
	'',
	'{',
	'{"a":',
	'[]',
	'"just a string"',
	'\u0000',
	'{"a":1}{"b":2}',
	'['.repeat(5000) + ']'.repeat(5000),
	'{"observations":{"__proto__":{"x":1}}}',
	'{"__proto__":{"isAdmin":true}}'
);

export type JsonSchema = {
	$ref?: string;
	$defs?: Record<string, JsonSchema>;
	type?: string | string[];
	properties?: Record<string, JsonSchema>;
	required?: string[];
	additionalProperties?: boolean | JsonSchema;
	items?: JsonSchema;
	enum?: unknown[];
	const?: unknown;
	pattern?: string;
	anyOf?: JsonSchema[];
	oneOf?: JsonSchema[];
	minimum?: number;
	maximum?: number;
};

export type SchemaContext = {
	/** Where `#/…` references of the schema point (its own document). */
	root: JsonSchema;
	/** Where `#/components/…` references point: the OpenAPI document. */
	document?: unknown;
	/** Keys to try in an open record (observation keys, say). */
	recordKeys: readonly string[];
	/** Strings to try where a string goes. */
	seen: readonly string[];
};

function resolve(schema: JsonSchema, context: SchemaContext): JsonSchema {
	if (!schema.$ref?.startsWith('#/')) return schema;
	let target: unknown = schema.$ref.startsWith('#/components/') ? context.document : context.root;
	for (const part of schema.$ref.slice(2).split('/'))
		target = (target as Record<string, unknown> | undefined)?.[part];
	return (target as JsonSchema) ?? {};
}

function byType(type: string, schema: JsonSchema, context: SchemaContext, depth: number) {
	const { minimum, maximum } = schema;
	switch (type) {
		case 'number':
		case 'integer':
			return minimum !== undefined && maximum !== undefined
				? fc.oneof(numberText, fc.double({ min: minimum, max: maximum, noNaN: true }).map(String))
				: numberText;
		case 'string':
			return (
				schema.pattern
					? fc.oneof(
							{ weight: 1, arbitrary: fc.stringMatching(new RegExp(schema.pattern)) },
							{ weight: 1, arbitrary: fc.constantFrom(...DATES) },
							{ weight: 1, arbitrary: stringFrom(context.seen) }
						)
					: stringFrom(context.seen)
			).map((s) => JSON.stringify(s));
		case 'boolean':
			return fc.constantFrom('true', 'false');
		case 'null':
			return fc.constant('null');
		case 'array':
			return fc
				.array(shapedText(schema.items ?? {}, context, depth + 1), { maxLength: 5 })
				.map((items) => `[${items.join(',')}]`);
		default:
			return objectByShape(schema, context, depth);
	}
}

function objectByShape(schema: JsonSchema, context: SchemaContext, depth: number) {
	// An unknown key now and then (a prototype key most often): most schemas refuse any.
	const hostilePairs = fc
		.option(fc.tuple(keyFrom(PROTOTYPE_KEYS), anyJsonText(PROTOTYPE_KEYS, context.seen)), {
			freq: 2
		})
		.map((pair) => (pair ? [pair] : []));
	// Required properties nearly always, optional ones half the time, so the body gets past the
	// schema's first checks to the code behind them.
	const required = new Set(schema.required ?? []);
	const known = fc
		.tuple(
			...Object.entries(schema.properties ?? {}).map(([key, sub]) =>
				fc.option(
					shapedText(sub, context, depth + 1).map((v) => [key, v] as [string, string]),
					{ freq: required.has(key) ? 12 : 4, nil: null }
				)
			)
		)
		.map((pairs) => pairs.filter((pair) => pair !== null));
	const open = schema.additionalProperties;
	const extra =
		open && typeof open === 'object'
			? fc.array(fc.tuple(keyFrom(context.recordKeys), shapedText(open, context, depth + 1)), {
					maxLength: 6
				})
			: fc.constant([] as [string, string][]);
	return fc
		.tuple(known, extra, hostilePairs)
		.map(([a, b, c]) => objectText([...a, ...b, ...c] as [string, string][]));
}

/** JSON text shaped like `schema` most of the time, with a hostile value anywhere. */
export function shapedText(
	schema: JsonSchema,
	context: SchemaContext,
	depth = 0
): fc.Arbitrary<string> {
	const resolved = resolve(schema, context);
	const hostile = anyJsonText(context.recordKeys, context.seen);
	if (depth > 4) return hostile;
	let shaped: fc.Arbitrary<string>;
	const variants = resolved.anyOf ?? resolved.oneOf;
	if (resolved.const !== undefined) shaped = fc.constant(JSON.stringify(resolved.const));
	else if (resolved.enum) shaped = fc.constantFrom(...resolved.enum.map((v) => JSON.stringify(v)));
	else if (variants) shaped = fc.oneof(...variants.map((v) => shapedText(v, context, depth + 1)));
	else if (Array.isArray(resolved.type))
		shaped = fc.oneof(...resolved.type.map((t) => byType(t, resolved, context, depth)));
	else if (resolved.type || resolved.properties)
		shaped = byType(resolved.type ?? 'object', resolved, context, depth);
	else shaped = hostile;
	return fc.oneof({ weight: 8, arbitrary: shaped }, { weight: 1, arbitrary: hostile });
}

/** A JSON request body: shaped by the schema, any JSON, broken text, or cut short. */
export function jsonBody(
	schema: JsonSchema | undefined,
	context: SchemaContext
): fc.Arbitrary<string> {
	const shaped = schema
		? shapedText(schema, context)
		: anyJsonText(context.recordKeys, context.seen);
	return fc.oneof(
		{ weight: 8, arbitrary: shaped },
		{ weight: 1, arbitrary: anyJsonText(context.recordKeys, context.seen) },
		{ weight: 1, arbitrary: brokenJsonText },
		{ weight: 1, arbitrary: shaped.map((text) => text.slice(0, Math.ceil(text.length / 2))) }
	);
}

export type FormBody = { type: string | null; body: BodyInit; shown: string };

/** A form body: the page's own fields (some, with its values or hostile ones), in any encoding. */
export function formBody(
	fields: readonly string[],
	seen: readonly string[]
): fc.Arbitrary<FormBody> {
	const value = fc.oneof(stringFrom(seen), numberText);
	const pairs = fc
		.tuple(
			fc
				.subarray([...fields])
				.chain((chosen) =>
					fc.tuple(...chosen.map((name) => value.map((v) => [name, v] as [string, string])))
				),
			fc.array(fc.tuple(keyFrom(fields), value), { maxLength: 3 })
		)
		.map(([known, extra]) => [...known, ...extra]);
	const urlencoded = pairs.map((p) => {
		const body = new URLSearchParams(p).toString();
		return { type: 'application/x-www-form-urlencoded', body, shown: body };
	});
	const multipart = fc
		.tuple(pairs, fc.array(fc.boolean(), { maxLength: 12 }))
		.map(([p, asFile]) => {
			const data = new FormData();
			p.forEach(([name, v], index) => {
				if (asFile[index]) data.append(name, new Blob([v]), 'notes.txt');
				else data.append(name, v);
			});
			// fetch writes the multipart type with its boundary
			return { type: null, body: data, shown: `multipart ${JSON.stringify(p)} files ${asFile}` };
		});
	const brokenMultipart = fc
		.tuple(keyFrom(fields), value, fc.constantFrom('xyz', '', '"', 'a'.repeat(80)))
		.map(([name, v, boundary]) => {
			const body = `--xyz\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${v}`;
			return { type: `multipart/form-data; boundary=${boundary}`, body, shown: body };
		});
	const wrongType = fc
		.tuple(fc.constantFrom('text/plain', 'application/json', 'application/xml', null), value)
		.map(([type, body]) => ({ type, body, shown: `${type}: ${body}` }));
	return fc.oneof(
		{ weight: 5, arbitrary: urlencoded },
		{ weight: 3, arbitrary: multipart },
		{ weight: 2, arbitrary: brokenMultipart },
		{ weight: 1, arbitrary: wrongType }
	);
}
