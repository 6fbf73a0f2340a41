import { expect, test, type Page } from '@playwright/test';
import { signIn } from './helpers';

const FRONT_LEFT = '/corners/00000000-0000-4000-8000-0000000000f1';

// The corner page (3-D view, first solve) is slow to open on a busy two-core machine.
test.describe.configure({ timeout: 90_000 });

/** Collects console errors of a page. */
function consoleErrors(page: Page) {
	const errors: string[] = [];
	page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
	page.on('pageerror', (e) => errors.push(e.message));
	return errors;
}

test('fix search: the engineer restores the rack-moved toe curve with the tie-rod joints and saves a revision', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.locator('[data-revision="2"]').getByRole('link', { name: 'Start from this' }).click();
	await expect(page.getByText(/Showing r2 “rack moved”/)).toBeVisible({ timeout: 20_000 });
	await page.getByRole('link', { name: 'Fix search' }).click();
	await expect(page.getByRole('heading', { name: 'Fix search' })).toBeVisible({ timeout: 20_000 });
	expect((await page.reload())?.status()).toBe(200); // the page renders on the server too
	await expect(page.getByTestId('caution')).toBeVisible();
	await expect(page.getByTestId('fix-revision')).toHaveValue(/.+/);
	await expect(page.getByTestId('fix-revision').locator('option:checked')).toHaveText('r2 rack moved');

	// Only the tie-rod joints: inner y (rack-end length), outer x (steering-arm length) and z (spacer).
	for (const [coord, bound] of [['steer.inner y', '10'], ['steer.outer x', '10'], ['steer.outer z', '30']]) {
		await page.getByLabel(`Move ${coord}`).check();
		await page.getByLabel(`Bound ${coord} (mm)`).fill(bound);
	}
	await page.getByLabel('Move steer.inner z').uncheck();
	await page.getByLabel('Target revision').selectOption({ label: 'r1 stock (baseline)' });
	await page.getByRole('button', { name: 'Run fix search' }).click();

	// Stock over ±40 mm is the target; the issue asks for toe within 0.05° of it.
	const toeMax = page.getByTestId('max-after-toe');
	await expect(toeMax).toBeVisible({ timeout: 20_000 });
	expect(Number((await toeMax.textContent())!.replace('°', ''))).toBeLessThan(0.05);
	await expect(page.getByTestId('chart-toe-change').locator('path[data-series="after"]')).toHaveCount(1);
	await expect(page.getByTestId('chart-toe-change').locator('path[data-series="target"]')).toHaveCount(1);
	await expect(page.getByTestId('fix-note')).toContainText('steer.outer');
	await page.screenshot({ path: 'test-results/screens/fix-search.png', fullPage: true });

	await page.getByLabel('Revision label').fill('tie-rod fix');
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	const saved = page.getByTestId('fix-saved');
	await expect(saved).toContainText(/Saved as r\d+: Fix search moved steer\.(inner|outer)/);
	await saved.getByRole('link').click();
	await expect(page.getByText(/Showing r\d+ “tie-rod fix”/)).toBeVisible({ timeout: 20_000 });
	expect(errors).toEqual([]);
});

test('tolerance study: a small study draws the bands, ranks the points and stores the shop tolerances', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.locator('[data-revision="1"]').getByRole('link', { name: 'Start from this' }).click();
	await expect(page.getByText(/Showing r1 “stock”/)).toBeVisible({ timeout: 20_000 });
	await page.getByRole('link', { name: 'Tolerance study' }).click();
	await expect(page.getByRole('heading', { name: 'Tolerance study' })).toBeVisible({ timeout: 20_000 });
	expect((await page.reload())?.status()).toBe(200); // the page renders on the server too
	await expect(page.getByTestId('caution')).toBeVisible();
	await page.getByLabel('Samples').fill('300');
	await page.getByLabel('Study name').fill(`e2e tolerances ${Date.now()}`);
	await page.getByRole('button', { name: 'Run tolerance study' }).click();

	const toe = page.getByTestId('chart-toe-change');
	await expect(toe.locator('path[data-spread="p5-p95"]')).toHaveCount(1, { timeout: 20_000 });
	await expect(toe.locator('path[data-spread="min-max"]')).toHaveCount(1);
	expect((await toe.locator('path[data-spread="p5-p95"]').getAttribute('d'))!.length).toBeGreaterThan(100);
	await expect(page.getByTestId('study-summary')).toContainText('300 samples');
	// The tie-rod joints decide bump steer: they lead the toe variance (the rack joint is the most sensitive, first order).
	const first = page.getByTestId('variance-shares').locator('tbody tr').first();
	await expect(first).toHaveAttribute('data-point', /^steer\./);
	await expect(page.getByTestId('sensitivity-ranking')).toContainText('Toe change over the range');
	await expect(page.getByTestId('suggested-tolerances')).toContainText('steer.inner');
	await page.screenshot({ path: 'test-results/screens/tolerance-study.png', fullPage: true });

	await page.getByRole('button', { name: 'Use these tolerances on the shop sheet' }).click();
	await expect(page.getByTestId('tolerances-adopted')).toContainText('Stored for the shop sheet of r1 stock');
	expect(errors).toEqual([]);
});
