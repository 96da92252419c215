import { expect, test } from '@playwright/test';

test.beforeEach(async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill('tech@saltmarsh.example');
	await page.getByLabel('Password').fill(process.env.E2E_DEMO_PASSWORD!);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toContainText('Good to see you');
	await page.goto('/rank');
	await expect(page.getByText('Next question')).toBeVisible();
});

test('the complaint is matched to observations and the ranking follows it', async ({ page }) => {
	await page
		.getByLabel('Customer complaint')
		.fill('gets hot sitting in traffic and the fan never comes on');
	await page.getByRole('button', { name: 'Match complaint' }).click();
	const matched = page.getByRole('list', { name: 'Matched from the complaint' });
	await expect(matched).toContainText('hot sitting in traffic');
	const first = page.getByRole('figure').getByRole('listitem').first();
	await expect(first).toContainText('Cooling fan not running');
});

test('a technician answers with the keyboard and undoes an answer', async ({ page }) => {
	const question = page.getByText('Next question').locator('..').getByRole('heading');
	const before = await question.textContent();
	await page.keyboard.press('1');
	await expect(page.getByText('Answers so far')).toBeVisible();
	await expect(question).not.toHaveText(before!);
	await page.getByRole('button', { name: /^Undo answer to/ }).click();
	await expect(page.getByText('Answers so far')).toHaveCount(0);
	await expect(question).toHaveText(before!);
});

test('a confirming test result is recorded from the plan and re-ranks the causes', async ({
	page
}) => {
	const plan = page.getByRole('heading', { name: 'Confirming tests, in order' }).locator('..');
	await plan.getByRole('button', { name: 'Record result' }).first().click();
	const choices = plan.getByRole('group', { name: /^Result of / });
	await expect(choices).toBeVisible();
	await choices.getByRole('button').last().click();
	await expect(page.getByText('Answers so far')).toBeVisible();
});

test('every test of the plan can be recorded, a numeric result included', async ({ page }) => {
	const plan = page.getByRole('heading', { name: 'Confirming tests, in order' }).locator('..');
	const more = plan.getByText(/^More tests/);
	if (await more.isVisible()) await more.click();
	const card = plan.getByRole('listitem').filter({ hasText: 'freeze point' });
	await card.getByRole('button', { name: 'Record result' }).click();
	// A 30 % glycol mix freezes near −15 °C (US Army TM 5-3895-382-24).
	await card.getByLabel(/^Result/).fill('-15');
	await card.getByRole('button', { name: 'Record', exact: true }).click();
	await expect(page.getByText('Answers so far')).toBeVisible();
	await expect(page.getByText('-15 degC')).toBeVisible();
});
