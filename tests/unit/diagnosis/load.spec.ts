import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { loadRulebookFromDir, RulebookError } from '../../../src/lib/diagnosis/load';
import type { Rulebook } from '../../../src/lib/diagnosis/schema';
import { makeCoolingRulebook } from './factories';

const created: string[] = [];

function writeRulebookDir(
	rulebook: Rulebook,
	edit?: (files: Record<string, string>) => void
): string {
	const root = mkdtempSync(join(tmpdir(), 'causeway-rules-'));
	created.push(root);
	const dir = join(root, 'rules');
	mkdirSync(dir);
	const files: Record<string, string> = {
		'meta.json': JSON.stringify(rulebook.meta, null, '\t'),
		'causes.json': JSON.stringify({ causes: rulebook.causes }, null, '\t'),
		'observations.json': JSON.stringify({ observations: rulebook.observations }, null, '\t'),
		'rules.json': JSON.stringify({ rules: rulebook.rules }, null, '\t'),
		'tests.json': JSON.stringify({ tests: rulebook.tests }, null, '\t')
	};
	edit?.(files);
	for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
	return dir;
}

function catchRulebookError(dir: string): RulebookError {
	try {
		loadRulebookFromDir(dir);
	} catch (error) {
		if (error instanceof RulebookError) return error;
		throw error;
	}
	throw new Error('expected a RulebookError');
}

afterEach(() => {
	for (const root of created.splice(0)) rmSync(root, { recursive: true, force: true });
});

describe('loadRulebookFromDir', () => {
	it('assembles the five files into the rulebook they were written from', () => {
		const rulebook = makeCoolingRulebook();
		expect(loadRulebookFromDir(writeRulebookDir(rulebook))).toEqual(rulebook);
	});

	it('maps a bad condition value to rules/rules.json and its path inside that file', () => {
		const rulebook = makeCoolingRulebook();
		const index = rulebook.rules.findIndex((rule) => rule.key === 'hot-at-idle');
		(rulebook.rules[index].conditions as { all: { value: unknown }[] }).all[0].value = 'hot';
		const error = catchRulebookError(writeRulebookDir(rulebook));
		expect(error.issues).toEqual([
			{
				file: 'rules/rules.json',
				path: `rules[${index}].conditions.all[0].value`,
				message: expect.stringContaining(`"hot" is not one of temp_gauge's values`)
			}
		]);
		expect(error.message).toContain(`rules/rules.json: rules[${index}].conditions.all[0].value:`);
	});

	it('maps meta issues to meta.json with paths relative to the meta object', () => {
		const rulebook = makeCoolingRulebook();
		rulebook.meta.bands = { likely: 0.2, possible: 0.3 };
		const error = catchRulebookError(writeRulebookDir(rulebook));
		expect(error.issues.map((issue) => [issue.file, issue.path])).toContainEqual([
			'rules/meta.json',
			'bands.possible'
		]);
	});

	it('maps cross-file issues to the file that holds the bad entry', () => {
		const rulebook = makeCoolingRulebook();
		rulebook.tests[1].sets = 'pressure_tset';
		const error = catchRulebookError(writeRulebookDir(rulebook));
		expect(error.issues).toContainEqual({
			file: 'rules/tests.json',
			path: 'tests[1].sets',
			message: 'unknown observation "pressure_tset"'
		});
		expect(error.issues.map((issue) => issue.file)).toContain('rules/observations.json');
	});

	it('reports bad JSON with the file name and the parser message', () => {
		const dir = writeRulebookDir(makeCoolingRulebook(), (files) => {
			files['causes.json'] = '{ "causes": [ { "key": "x", } ] }';
		});
		const error = catchRulebookError(dir);
		expect(error.issues).toHaveLength(1);
		expect(error.issues[0]).toMatchObject({ file: 'rules/causes.json', path: '' });
		expect(error.issues[0].message).toMatch(/^not valid JSON: /);
	});

	it('reports a missing file and a file without its wrapping key', () => {
		const dir = writeRulebookDir(makeCoolingRulebook(), (files) => {
			files['rules.json'] = JSON.stringify([]);
		});
		rmSync(join(dir, 'tests.json'));
		const error = catchRulebookError(dir);
		expect(error.issues).toEqual([
			{ file: 'rules/rules.json', path: '', message: 'expected an object with a "rules" array' },
			{ file: 'rules/tests.json', path: '', message: 'file not found' }
		]);
	});
});

describe('scripts/rules-check.ts', () => {
	it('prints the counts of a valid folder and exits 0, and lists issues with exit 1 otherwise', () => {
		const rulebook = makeCoolingRulebook();
		const output = execFileSync(
			process.execPath,
			['--import', 'tsx', 'scripts/rules-check.ts', writeRulebookDir(rulebook)],
			{ encoding: 'utf8' }
		);
		expect(output).toContain(`causes:       ${rulebook.causes.length}`);
		expect(output).toContain(`rules:        ${rulebook.rules.length}`);

		rulebook.rules[0].lr = 1;
		let failure: { status: number; stderr: string } | undefined;
		try {
			execFileSync(
				process.execPath,
				['--import', 'tsx', 'scripts/rules-check.ts', writeRulebookDir(rulebook)],
				{ encoding: 'utf8', stdio: 'pipe' }
			);
		} catch (error) {
			failure = error as { status: number; stderr: string };
		}
		expect(failure?.status).toBe(1);
		expect(failure?.stderr).toContain('rules/rules.json: rules[0].lr: lr must not be 1');
	});
});
