import { expect, test } from '@playwright/test';

test('on a tablet a technician answers by touch and the ranking updates beside the prompt', async ({
	page
}) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill('tech@saltmarsh.example');
	await page.getByLabel('Password').fill(process.env.E2E_DEMO_PASSWORD!);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toContainText('Good to see you');
	await page.getByRole('link', { name: 'Rank causes' }).first().tap();
	const question = page.getByText('Next question').locator('..');
	await expect(question.getByRole('heading')).toBeVisible();
	const first = question.getByRole('button').first();
	const box = await first.boundingBox();
	expect(box!.height).toBeGreaterThanOrEqual(44); // WCAG 2.2 target size, 44 CSS px
	expect(box!.width).toBeGreaterThanOrEqual(44);
	const prompt = await question.getByRole('heading').textContent();
	await first.tap();
	await expect(page.getByText('Answers so far')).toBeVisible();
	await expect(question.getByRole('heading')).not.toHaveText(prompt!);
	await expect(page.getByRole('heading', { name: 'Likely causes' })).toBeVisible();
});
