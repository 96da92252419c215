import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		expect: { requireAssertions: true },
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					environment: 'node',
					include: ['src/**/*.spec.ts', 'tests/unit/**/*.spec.ts']
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.spec.ts'],
					globalSetup: ['tests/integration/global-setup.ts'],
					testTimeout: 30_000,
					hookTimeout: 60_000,
					// One real server per run; files share it, so run them one after another.
					fileParallelism: false
				}
			}
		]
	}
});
