import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'linkwright-demo';

/** Signs in through the sign-in page and waits for the dashboard. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByRole('heading', { name: 'Cars' })).toBeVisible();
	// the page's scripts loaded and hydrated before the first click (a click before hydration is a plain HTML click)
	await page.waitForLoadState('networkidle');
}

/** Waits until the page's scripts have loaded (and so hydrated) after a navigation. */
export async function settled(page: Page) {
	await page.waitForLoadState('networkidle');
}
