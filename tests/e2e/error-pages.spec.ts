import { expect, test } from '@playwright/test';
import { signIn } from './helpers';

test('an unknown page shows a friendly 404 inside the app shell', async ({ page }) => {
	await signIn(page, 'viewer@linkwright.test');
	const res = await page.goto('/cars/00000000-0000-4000-8000-000000000bad');
	expect(res?.status()).toBe(404);
	await expect(page.getByRole('heading', { name: 'Not found' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'Back to your cars' })).toBeVisible();
});
