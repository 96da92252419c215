import { expect, test, type Page } from '@playwright/test';

async function signInAsTechnician(page: Page) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill('tech@saltmarsh.example');
	await page.getByLabel('Password').fill(process.env.E2E_DEMO_PASSWORD!);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toContainText('Good to see you');
}

test('a technician works out a freeze point and the boiling point under a 15 psi cap', async ({
	page
}) => {
	await signInAsTechnician(page);
	await page
		.getByRole('navigation', { name: 'Main' })
		.getByRole('link', { name: 'Calculators' })
		.click();
	await expect(page.getByRole('heading', { level: 1, name: 'Calculators' })).toBeVisible();

	const freeze = page.locator('section#freeze-point');
	const percent = freeze.getByLabel('Glycol concentration (%)');
	await freeze.getByLabel('Concentration given').selectOption('volume');
	await percent.fill('50');
	await freeze.getByRole('button', { name: 'Calculate' }).click();
	// US Army TM 5-3895-382-24: 50 vol % ethylene glycol antifreeze freezes at −37 °C.
	const freezeRow = freeze.locator('[data-row="freezePoint"]');
	await expect(freezeRow).toContainText('−37 °C');
	await expect(freezeRow).toContainText('°F');
	await expect(freeze.getByRole('img', { name: /Freeze point against glycol/ })).toBeVisible();
	// The chart's numbers are beside it in a table: 50 % and the printed table points.
	const table = freeze.getByRole('table', { name: /Freeze point against glycol/ });
	await expect(table.getByRole('row', { name: /This mix: 50/ })).toContainText('−37');
	await expect(freeze.locator('svg path').first()).toBeVisible();
	await expect(freeze.getByText(/poisonous to people and animals/)).toBeVisible();

	// US Army TM 5-6115-400-12: more glycol than about 60 % protects less.
	await percent.fill('60');
	await freeze.getByRole('button', { name: 'Calculate' }).click();
	await expect(freezeRow).toContainText('−52 °C');
	const warning = freeze.locator('.notice-caution', { hasText: 'protects less' });
	await expect(warning).toBeVisible();
	await expect(warning).toContainText('more glycol than about 60 % protects less');

	await percent.fill('65');
	await freeze.getByRole('button', { name: 'Calculate' }).click();
	await expect(freeze.getByText(/do not exceed 60 %/)).toBeVisible();
	await expect(percent).toHaveAttribute('aria-invalid', 'true');
	await expect(percent).toBeFocused();

	const boil = page.locator('section#boiling-point');
	await boil.getByLabel('Cap pressure', { exact: true }).fill('15');
	await boil.getByLabel('Unit of the cap pressure').selectOption('psi');
	await boil.getByLabel('Water only').check();
	await expect(boil.getByLabel('Glycol concentration (%)')).toBeHidden();
	const calculate = boil.getByRole('button', { name: 'Calculate' });
	const box = await calculate.boundingBox();
	expect(box!.height).toBeGreaterThanOrEqual(44); // WCAG 2.2 target size, 44 CSS px
	await calculate.click();
	// IAPWS-IF97 derived table: water under a 15 psi cap at sea level boils at 120.95 °C.
	await expect(boil.locator('[data-row="boilingPoint"]')).toContainText('120.95 °C');
	await expect(boil.locator('[data-row="capGauge"]')).toContainText('103.42 kPa');
	await expect(boil.getByRole('heading', { name: 'Result' })).toBeFocused();
	await expect(boil.getByText(/Never open a hot, pressurised cap/)).toBeVisible();
});

test('on a tablet the page fits the screen and the drain-and-fill bars appear', async ({
	page
}) => {
	await page.setViewportSize({ width: 820, height: 1180 });
	await signInAsTechnician(page);
	await page.goto('/calculators');
	await page.getByRole('link', { name: 'Drain-and-fill' }).click();
	const section = page.locator('section#drain-and-fill');
	await section.getByLabel('System capacity', { exact: true }).fill('10');
	await section.getByLabel('Drained each cycle (same unit)').fill('4');
	await section.getByLabel('Number of cycles').fill('2');
	await section.getByRole('button', { name: 'Calculate' }).click();
	// Common practice, no source: 4 L of 10 L renews 40 % a cycle; two cycles 1 − 0.6² = 64 %.
	await expect(section.locator('[data-row="renewedPerCycle"]')).toContainText('40 %');
	await expect(section.locator('[data-row="freshAfterCycles"]')).toContainText('64 %');
	await expect(section.getByRole('img', { name: /Fresh coolant after each cycle/ })).toBeVisible();
	const bars = section.getByRole('table', { name: 'Fresh coolant after each cycle' });
	await expect(bars.getByRole('row')).toHaveCount(3); // a header and one row per cycle
	await expect(bars.getByRole('row', { name: '2' })).toContainText('64');
	// "50,5"-style input: a decimal comma is read as a decimal, letters are refused by name.
	await section.getByLabel('Drained each cycle (same unit)').fill('4,5');
	await section.getByLabel('Number of cycles').fill('0');
	await section.getByRole('button', { name: 'Calculate' }).click();
	await expect(
		section.getByText('Number of cycles must be a whole number from 1 to 100.')
	).toBeVisible();
	await expect(section.getByLabel('Number of cycles')).toBeFocused();
	await section.getByLabel('Number of cycles').fill('one');
	await section.getByRole('button', { name: 'Calculate' }).click();
	await expect(
		section.getByText(/Number of cycles must be a number, such as 50.5 or 50,5/)
	).toBeVisible();
	await section.getByLabel('Number of cycles').fill('1');
	await section.getByRole('button', { name: 'Calculate' }).click();
	// 4.5 L of 10 L renews 45 % a cycle (worked by hand).
	await expect(section.locator('[data-row="renewedPerCycle"]')).toContainText('45 %');
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth - document.documentElement.clientWidth
	);
	expect(overflow).toBeLessThanOrEqual(0);
});

test.describe('without JavaScript', () => {
	test.use({ javaScriptEnabled: false });

	test('the freeze-point form still posts and shows the answer', async ({ page }) => {
		await signInAsTechnician(page);
		await page.goto('/calculators');
		const freeze = page.locator('section#freeze-point');
		await freeze.getByLabel('Concentration given').selectOption('mass');
		await freeze.getByLabel('Glycol concentration (%)').fill('40');
		await freeze.getByRole('button', { name: 'Calculate' }).click();
		// CRC Handbook of Chemistry and Physics, 102nd ed. (2021): 40 wt % EG → −23.84 °C.
		await expect(page.locator('section#freeze-point [data-row="freezePoint"]')).toContainText(
			'−23.84 °C'
		);
		await expect(
			page.locator('section#freeze-point').getByLabel('Glycol concentration (%)')
		).toHaveValue('40');
	});
});
