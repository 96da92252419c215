// Validates a rulebook folder (default: rules/) and prints a summary, or every issue and exit 1.
// Run: node --import tsx scripts/rules-check.ts [dir]
import { resolve } from 'node:path';
import { formatFileIssue, loadRulebookFromDir, RulebookError } from '../src/lib/diagnosis/load';

function checkRules(dir: string): number {
	try {
		const rulebook = loadRulebookFromDir(resolve(dir));
		const supporting = rulebook.rules.filter((rule) => rule.lr > 1).length;
		console.log(`${dir}: ${rulebook.meta.name} is valid`);
		console.log(`  causes:       ${rulebook.causes.length}`);
		console.log(`  observations: ${rulebook.observations.length}`);
		console.log(
			`  rules:        ${rulebook.rules.length} (${supporting} supporting, ${rulebook.rules.length - supporting} arguing against)`
		);
		console.log(`  tests:        ${rulebook.tests.length}`);
		return 0;
	} catch (error) {
		if (error instanceof RulebookError) {
			console.error(`${dir}: ${error.issues.length} issue(s)`);
			for (const issue of error.issues) console.error(`  ${formatFileIssue(issue)}`);
			return 1;
		}
		throw error;
	}
}

process.exitCode = checkRules(process.argv[2] ?? 'rules');
