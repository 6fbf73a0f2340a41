import { expect, test } from '@playwright/test';
import { signIn } from './helpers';

for (const role of ['owner', 'engineer', 'viewer'] as const) {
	test(`the demo ${role} signs in, sees the demo car and signs out`, async ({ page }) => {
		await signIn(page, `${role}@linkwright.test`);
		await expect(page.getByTestId('role-badge')).toHaveText(role);
		await expect(page.getByRole('link', { name: /Hillclimb demo car/ })).toBeVisible();
		await page.getByRole('button', { name: /^Demo / }).click();
		await page.getByRole('menuitem', { name: 'Sign out' }).click();
		await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
		await page.goto('/');
		await expect(page).toHaveURL(/\/signin\?redirectTo=/);
	});
}

test('a wrong password shows a clear message and gives no session', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill('engineer@linkwright.test');
	await page.getByLabel('Password').fill('not-the-password');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('signin-error')).toHaveText('Wrong e-mail or password.');
	await page.goto('/');
	await expect(page).toHaveURL(/\/signin/);
});

test('an empty e-mail is refused naming the field', async ({ page }) => {
	await page.goto('/signin');
	await page.getByLabel('Password').fill('whatever');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByText('Enter a valid e-mail address')).toBeVisible();
});

test('the viewer sees no button to create a car; the engineer creates one', async ({ browser }) => {
	const viewer = await browser.newPage();
	await signIn(viewer, 'viewer@linkwright.test');
	await expect(viewer.getByRole('link', { name: 'New car' })).toHaveCount(0);
	await viewer.close();

	const engineer = await browser.newPage();
	await signIn(engineer, 'engineer@linkwright.test');
	await engineer.getByRole('link', { name: 'New car' }).click();
	await engineer.getByLabel('Name').fill('Sprint car e2e');
	await engineer.getByLabel('Wheelbase (mm)').fill('-5');
	await engineer.getByRole('button', { name: 'Create car' }).click();
	await expect(engineer.getByText('Wheelbase must be above 0 mm')).toBeVisible();
	await expect(engineer.getByLabel('Name')).toHaveValue('Sprint car e2e');
	await engineer.getByLabel('Wheelbase (mm)').fill('2250');
	await engineer.getByRole('button', { name: 'Create car' }).click();
	await expect(engineer.getByRole('heading', { name: 'Sprint car e2e' })).toBeVisible();
	await expect(engineer.getByText('2250 mm')).toBeVisible();
	await engineer.close();
});

test('a new account gets its own team and cannot open the demo car', async ({ page }) => {
	const email = `e2e-${Date.now()}@example.test`;
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Test Builder');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel(/^Password/).fill('a long enough password');
	await page.getByLabel('Team name').fill('Test garage');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Cars' })).toBeVisible();
	await expect(page.getByText('Test garage · 0 cars')).toBeVisible();
	await expect(page.getByTestId('role-badge')).toHaveText('owner');
	const res = await page.goto('/cars/00000000-0000-4000-8000-00000000ca01');
	expect(res?.status()).toBe(404);
});

test('the app shell is keyboard-usable and has a dark theme', async ({ page }) => {
	await signIn(page, 'owner@linkwright.test');
	await page.keyboard.press('Tab');
	await expect(page.getByRole('link', { name: 'Skip to content' })).toBeFocused();
	await page.getByRole('button', { name: 'Use dark theme' }).click();
	await expect(page.locator('html')).toHaveClass(/dark/);
	await page.reload();
	await expect(page.locator('html')).toHaveClass(/dark/);
	await page.screenshot({ path: 'test-results/screens/dashboard-dark.png', fullPage: true });
});

test('"Sign out everywhere" on the Account page ends the sessions of this and another browser', async ({ browser }) => {
	const email = `e2e-everywhere-${Date.now()}@example.test`;
	const first = await browser.newContext();
	const page = await first.newPage();
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Session Tester');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel(/^Password/).fill('a long enough password');
	await page.getByLabel('Team name').fill('Session garage');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Cars' })).toBeVisible();
	const second = await browser.newContext();
	const other = await second.newPage();
	await signIn(other, email, 'a long enough password');
	await page.goto('/account');
	await expect(page.getByText('You are signed in on 2 browsers')).toBeVisible();
	await page.getByRole('button', { name: 'Sign out everywhere' }).click();
	await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
	// the other browser still holds its cookie, but its session has ended on the server
	await other.goto('/');
	await expect(other).toHaveURL(/\/signin\?redirectTo=/);
	await first.close();
	await second.close();
});
