// Loading a rulebook from its folder of JSON files, with every issue named by file and path.
import { readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { formatIssuePath } from '../calculators/format';
import { rulebookSchema, type Rulebook } from './schema';

export interface RulebookFileIssue {
	/** e.g. `rules/rules.json` (folder name + file name). */
	file: string;
	/** Path inside that file, e.g. `rules[12].conditions.all[0].value`; '' for the whole file. */
	path: string;
	message: string;
}

export class RulebookError extends Error {
	readonly issues: RulebookFileIssue[];

	constructor(issues: RulebookFileIssue[]) {
		super(
			`Rulebook is invalid (${issues.length} issue${issues.length === 1 ? '' : 's'}):\n` +
				issues.map((issue) => `  ${formatFileIssue(issue)}`).join('\n')
		);
		this.name = 'RulebookError';
		this.issues = issues;
	}
}

export function formatFileIssue(issue: RulebookFileIssue): string {
	return issue.path
		? `${issue.file}: ${issue.path}: ${issue.message}`
		: `${issue.file}: ${issue.message}`;
}

// meta.json holds the meta object itself; the other files wrap their list in one named key.
const PART_FILES = {
	meta: 'meta.json',
	causes: 'causes.json',
	observations: 'observations.json',
	rules: 'rules.json',
	tests: 'tests.json'
} as const;
type Part = keyof typeof PART_FILES;
const PARTS = Object.keys(PART_FILES) as Part[];

function readJsonFile(
	dir: string,
	fileName: string,
	issues: RulebookFileIssue[]
): { ok: true; json: unknown } | { ok: false } {
	const file = `${basename(dir)}/${fileName}`;
	let text: string;
	try {
		text = readFileSync(join(dir, fileName), 'utf8');
	} catch (error) {
		const code = (error as NodeJS.ErrnoException).code;
		issues.push({
			file,
			path: '',
			message: code === 'ENOENT' ? 'file not found' : `cannot read file (${code ?? String(error)})`
		});
		return { ok: false };
	}
	try {
		return { ok: true, json: JSON.parse(text) };
	} catch (error) {
		issues.push({ file, path: '', message: `not valid JSON: ${(error as Error).message}` });
		return { ok: false };
	}
}

/**
 * Reads the five rulebook files of `dir`, assembles `{ meta, causes, observations, rules, tests }`
 * and validates it. Throws RulebookError listing every issue with its file and in-file path.
 */
export function loadRulebookFromDir(dir: string): Rulebook {
	const issues: RulebookFileIssue[] = [];
	const assembled: Record<string, unknown> = {};
	for (const part of PARTS) {
		const fileName = PART_FILES[part];
		const read = readJsonFile(dir, fileName, issues);
		if (!read.ok) continue;
		if (part === 'meta') {
			assembled.meta = read.json;
			continue;
		}
		const json = read.json;
		if (typeof json !== 'object' || json === null || Array.isArray(json) || !(part in json)) {
			issues.push({
				file: `${basename(dir)}/${fileName}`,
				path: '',
				message: `expected an object with a "${part}" array`
			});
			continue;
		}
		const extraKeys = Object.keys(json).filter((key) => key !== part);
		if (extraKeys.length > 0) {
			issues.push({
				file: `${basename(dir)}/${fileName}`,
				path: extraKeys[0],
				message: `unexpected key "${extraKeys[0]}" (the file holds only "${part}")`
			});
		}
		assembled[part] = (json as Record<string, unknown>)[part];
	}
	if (issues.length > 0) throw new RulebookError(issues);

	const result = rulebookSchema.safeParse(assembled);
	if (result.success) return result.data;
	throw new RulebookError(
		result.error.issues.map((issue) => mapIssueToFile(dir, issue.path, issue.message))
	);
}

function mapIssueToFile(
	dir: string,
	path: readonly PropertyKey[],
	message: string
): RulebookFileIssue {
	const [head, ...rest] = path;
	const part = PARTS.find((candidate) => candidate === head);
	if (!part) {
		// An issue on the assembled object itself (e.g. an unexpected top-level key).
		return { file: basename(dir), path: formatIssuePath(path), message };
	}
	const file = `${basename(dir)}/${PART_FILES[part]}`;
	return { file, path: formatIssuePath(part === 'meta' ? rest : path), message };
}
