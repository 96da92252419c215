// npm test: unit tests, then a production build, then integration tests against the real server
// and end-to-end tests in Chromium. Each runner prints its own summary; the last line adds them up.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import { ensureChromium } from './chromium.js';

const REPORT_DIR = 'tests/.tmp/reports';
rmSync(REPORT_DIR, { recursive: true, force: true });
mkdirSync(REPORT_DIR, { recursive: true });

const only = process.argv.slice(2); // e.g. `npm test -- unit integration`
const wants = (stage) => only.length === 0 || only.includes(stage);

function run(title, command, args, env = {}) {
	console.log(`\n━━ ${title} ━━`);
	const result = spawnSync(command, args, { stdio: 'inherit', env: { ...process.env, ...env } });
	return result.status ?? 1;
}

function vitestCounts(file) {
	try {
		const report = JSON.parse(readFileSync(file, 'utf8'));
		return {
			passed: report.numPassedTests,
			failed: report.numFailedTests + (report.numFailedTestSuites ?? 0),
			skipped: report.numPendingTests + report.numTodoTests
		};
	} catch {
		return null;
	}
}

function playwrightCounts(file) {
	try {
		const { stats } = JSON.parse(readFileSync(file, 'utf8'));
		// A flaky test failed before it passed: it counts as a failure, and is named as such.
		if (stats.flaky > 0) console.log(`e2e: ${stats.flaky} flaky (counted as failed)`);
		return {
			passed: stats.expected,
			failed: stats.unexpected + stats.flaky,
			skipped: stats.skipped
		};
	} catch {
		return null;
	}
}

const stages = [];
let exitCode = 0;

function vitestStage(name) {
	const file = `${REPORT_DIR}/${name}.json`;
	const status = run(`${name} tests (vitest)`, 'npx', [
		'vitest',
		'run',
		'--project',
		name,
		'--reporter=default',
		'--reporter=json',
		`--outputFile.json=${file}`
	]);
	const counts = vitestCounts(file) ?? { passed: 0, failed: 1, skipped: 0 };
	if (status !== 0 && counts.failed === 0) counts.failed = 1; // the runner itself failed
	stages.push({ name, ...counts });
	if (status !== 0) exitCode = 1;
}

function e2eStage() {
	console.log('\n━━ end-to-end tests (playwright, Chromium) ━━');
	const chromium = ensureChromium();
	if ('error' in chromium) {
		console.log(chromium.error);
		stages.push({ name: 'e2e', passed: 0, failed: 1, skipped: 0 });
		exitCode = 1;
		return;
	}
	const file = `${REPORT_DIR}/e2e.json`;
	console.log(`Chromium: ${chromium.path}`);
	const result = spawnSync('npx', ['playwright', 'test', '--reporter=list,json'], {
		stdio: 'inherit',
		env: { ...process.env, PLAYWRIGHT_JSON_OUTPUT_NAME: file, CHROMIUM_PATH: chromium.path }
	});
	const status = result.status ?? 1;
	const counts = playwrightCounts(file) ?? { passed: 0, failed: 1, skipped: 0 };
	if (status !== 0 && counts.failed === 0) counts.failed = 1;
	stages.push({ name: 'e2e', ...counts });
	if (status !== 0) exitCode = 1;
}

if (wants('unit')) vitestStage('unit');

if (wants('integration') || wants('e2e')) {
	if (run('production build (vite build)', 'npx', ['vite', 'build']) !== 0) {
		stages.push({ name: 'build', passed: 0, failed: 1, skipped: 0 });
		exitCode = 1;
	} else {
		if (wants('integration')) vitestStage('integration');
		if (wants('e2e')) e2eStage();
	}
}

const total = stages.reduce(
	(t, s) => ({
		passed: t.passed + s.passed,
		failed: t.failed + s.failed,
		skipped: t.skipped + s.skipped
	}),
	{ passed: 0, failed: 0, skipped: 0 }
);
console.log('\n━━ summary ━━');
for (const s of stages)
	console.log(`${s.name}: ${s.passed} passed, ${s.failed} failed, ${s.skipped} skipped`);
console.log(`tests: ${total.passed} passed, ${total.failed} failed, ${total.skipped} skipped`);
process.exit(exitCode);
