import { expect, test, type Page } from '@playwright/test';
import { waitForLink } from '../support/smtp-catcher';

const password = () => process.env.E2E_DEMO_PASSWORD!;

async function signIn(page: Page, email: string, pass: string) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(pass);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toContainText('Good to see you');
}

const stamp = Date.now();

test('a new shop invites a technician, who joins from the e-mailed link', async ({
	page,
	browser
}) => {
	const owner = `owner.${stamp}@e2e.example`;
	await page.goto('/signup');
	await page.getByLabel('Shop name').fill('Kestrel Yard Motors');
	await page.getByLabel('Your name').fill('Oona Vale');
	await page.getByLabel('E-mail').fill(owner);
	await page.getByLabel('Password').fill('pressure-cap-rating-16');
	await page.getByRole('button', { name: 'Create shop' }).click();
	await expect(page.getByRole('heading', { name: 'Check your e-mail' })).toBeVisible();
	await page.goto(await waitForLink(process.env.E2E_MAIL_DIR!, owner, '/signup/'));
	await page.getByRole('button', { name: 'Create the shop' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toContainText('Good to see you, Oona');
	await expect(page.getByText('Kestrel Yard Motors · Shop admin')).toBeVisible();

	await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click();
	const techEmail = `tech.${stamp}@e2e.example`;
	await page.getByLabel('E-mail').fill(techEmail);
	await page.getByLabel('Role').selectOption('technician');
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${techEmail}.`)).toBeVisible();
	await expect(page.getByText(`${techEmail} · Technician`)).toBeVisible();

	const link = await waitForLink(process.env.E2E_MAIL_DIR!, techEmail, '/invite/');
	const context = await browser.newContext();
	const tech = await context.newPage();
	await tech.goto(link);
	await expect(tech.getByRole('heading', { name: 'Join Kestrel Yard Motors' })).toBeVisible();
	await tech.getByLabel('Your name').fill('Abel Strand');
	await tech.getByLabel('Choose a password').fill('infrared-survey-gun-8');
	await tech.getByRole('button', { name: 'Join the shop' }).click();
	await expect(tech.getByRole('heading', { level: 1 })).toContainText('Good to see you, Abel');
	const nav = tech.getByRole('navigation', { name: 'Main' });
	await expect(nav.getByRole('link', { name: 'Rank causes' })).toBeVisible();
	await expect(nav.getByRole('link', { name: 'Team' })).toHaveCount(0);
	const refused = await tech.goto('/settings/users');
	expect(refused?.status()).toBe(403);
	await expect(tech.getByRole('heading', { name: 'Not for your role' })).toBeVisible();

	// The link works once.
	const again = await (await browser.newContext()).newPage();
	const second = await again.goto(link);
	expect(second?.status()).toBe(404);
	await context.close();
});

const ROLE_VIEW = [
	{ email: 'tech@saltmarsh.example', sees: ['Rank causes', 'Calculators'], refused: '/rulebook' },
	{
		email: 'lead@saltmarsh.example',
		sees: ['Rank causes', 'Rulebook'],
		refused: '/settings/users'
	},
	{
		email: 'manager@saltmarsh.example',
		sees: ['Team', 'API keys', 'Audit log'],
		refused: '/settings/shop'
	},
	{
		email: 'admin@saltmarsh.example',
		sees: ['Team', 'API keys', 'Shop', 'Rulebook'],
		refused: null
	}
];

for (const role of ROLE_VIEW) {
	test(`${role.email} sees their sections and is refused the rest`, async ({ page }) => {
		await signIn(page, role.email, password());
		const nav = page.getByRole('navigation', { name: 'Main' });
		for (const label of role.sees)
			await expect(nav.getByRole('link', { name: label, exact: true })).toBeVisible();
		if (role.refused) {
			const res = await page.goto(role.refused);
			expect(res?.status()).toBe(403);
		}
		await page.goto('/');
		await page.getByRole('button', { name: 'Sign out' }).click();
		await expect(page).toHaveURL(/\/signin$/);
		const after = await page.goto('/');
		expect(page.url()).toContain('/signin?next=');
		expect(after?.status()).toBe(200);
	});
}

test('a wrong password shows one generic message and keeps the e-mail', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill('tech@saltmarsh.example');
	await page.getByLabel('Password').fill('not-the-password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('alert')).toHaveText(
		'That e-mail and password do not match an active account.'
	);
	await expect(page.getByLabel('E-mail')).toHaveValue('tech@saltmarsh.example');
});

test('high-contrast mode for the bay is one press away and survives a reload', async ({ page }) => {
	await signIn(page, 'tech@saltmarsh.example', password());
	const toggle = page.getByRole('button', { name: 'High contrast' });
	await expect(toggle).toHaveAttribute('aria-pressed', 'false');
	await toggle.click();
	await expect(page.locator('html')).toHaveAttribute('data-contrast', 'high');
	await page.reload();
	await expect(page.locator('html')).toHaveAttribute('data-contrast', 'high');
	await expect(page.getByRole('button', { name: 'High contrast' })).toHaveAttribute(
		'aria-pressed',
		'true'
	);
	const ink = await page.evaluate(() => getComputedStyle(document.body).color);
	expect(ink).toBe('rgb(0, 0, 0)');
});

test('fonts are served by Causeway itself, never fetched from a font host', async ({ page }) => {
	const hosts = new Set<string>();
	page.on('request', (request) => hosts.add(new URL(request.url()).host));
	await signIn(page, 'tech@saltmarsh.example', password());
	await page.evaluate(() => document.fonts.ready);
	const families = await page.evaluate(() => [...document.fonts].map((f) => f.family));
	expect(families.join(' ')).toContain('Atkinson Hyperlegible Next');
	expect([...hosts]).toEqual([new URL(page.url()).host]);
});
