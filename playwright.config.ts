import { defineConfig, devices } from '@playwright/test';

/** The production build on a fresh database per run, in Debian's Chromium (no browser download). */
export const E2E_PORT = Number(process.env.E2E_PORT ?? 4391);

export default defineConfig({
	testDir: 'tests/e2e',
	globalSetup: './tests/e2e/global-setup.ts',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	timeout: 60_000,
	expect: { timeout: 10_000 },
	outputDir: 'tests/.tmp/playwright',
	use: {
		baseURL: `http://127.0.0.1:${E2E_PORT}`,
		trace: 'retain-on-failure',
		screenshot: 'only-on-failure',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			args: [
				'--headless',
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	},
	projects: [
		{ name: 'desktop', use: { ...devices['Desktop Chrome'] }, testIgnore: /tablet\.spec\.ts/ },
		{
			name: 'tablet',
			use: { viewport: { width: 820, height: 1180 }, hasTouch: true, isMobile: false },
			testMatch: /tablet\.spec\.ts/
		}
	]
});
