import { expect, test, type Page } from '@playwright/test';
import { signIn } from './helpers';

const FRONT_LEFT = '/corners/00000000-0000-4000-8000-0000000000f1';

/** The y values of a plotted path ("M x,y L x,y …"), in SVG pixels. */
async function pathYs(page: Page, chart: string, series: string) {
	const d = await page.getByTestId(`chart-${chart}`).locator(`path[data-series="${series}"]`).first().getAttribute('d');
	return (d ?? '').match(/-?\d+(\.\d+)?/g)!.map(Number).filter((_, i) => i % 2 === 1);
}

/** Collects console errors of a page. */
function consoleErrors(page: Page) {
	const errors: string[] = [];
	page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
	page.on('pageerror', (e) => errors.push(e.message));
	return errors;
}

test('the workspace draws curves with data, moves the 3-D view and re-solves an edited point', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	// Other journeys may add revisions: open r3 (the 12 mm spacer, still outside the toe target) explicitly.
	await page.locator('[data-revision="3"]').getByRole('link', { name: 'Start from this' }).click();
	await expect(page.getByText(/Showing r3 “spacer 12 mm”/)).toBeVisible();
	await expect(page.getByTestId('caution')).toBeVisible();
	const toe = page.getByTestId('chart-toe');
	await expect(toe.locator('path[data-series="draft"]')).toHaveCount(1);
	const before = await pathYs(page, 'toe', 'draft');
	expect(before.length).toBeGreaterThan(150);
	expect(Math.max(...before) - Math.min(...before)).toBeGreaterThan(20);
	await expect(page.getByTestId('linkage-canvas')).toBeVisible();
	await expect(page.getByTestId('workspace-targets')).toContainText('Toe change within ±0.10° over -40…40 mm: fail');

	const slider = page.getByRole('slider', { name: 'Wheel travel, + bump position' });
	await expect(page.getByTestId('linkage-position')).toContainText(/ 0(\.0)? mm/);
	await slider.focus();
	await page.keyboard.press('End');
	await expect(page.getByTestId('linkage-position')).toContainText(/ \+80(\.0)? mm/);

	// Lower the outer tie-rod joint back by the spacer: the toe curve must change before saving.
	await page.getByLabel('Tie rod, outer joint, z in mm').fill('175');
	await expect.poll(async () => (await pathYs(page, 'toe', 'draft')).join(',')).not.toBe(before.join(','));
	expect(errors).toEqual([]);
	await page.screenshot({ path: 'test-results/screens/workspace.png', fullPage: true });
});

test('compare: stock against rack moved reads the bump-steer change and the failing target', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.getByRole('link', { name: 'Compare revisions' }).click();
	await page.getByTestId('pick-b').selectOption({ label: 'r2 rack moved' });
	await expect(page.getByRole('heading', { name: 'In short: r1 stock → r2 rack moved' })).toBeVisible();
	// Regression value, no outside source: the invented demo's rack moved 20 mm up and 15 mm back gives about
	// 2.3° of toe change over ±40 mm (solve command on fixtures/demo), stock about 0.01°.
	await expect(page.locator('[data-measure="toe"]')).toHaveText(/^Toe change over ±40 mm goes from 0\.0\d° to 2\.[23]\d°\.$/);
	await expect(page.getByTestId('target-A')).toContainText('A pass');
	await expect(page.getByTestId('target-B')).toContainText('B fail');
	const moved = page.getByTestId('moved-points');
	await expect(moved.locator('tbody tr')).toHaveCount(1);
	await expect(moved.locator('tbody tr').first()).toContainText('steer.inner');
	await expect(moved.locator('tbody tr').first()).toContainText('25.0');
	await expect(page.getByTestId('chart-toe').locator('path[data-series="b"]')).toHaveCount(1);
	expect(errors).toEqual([]);
	await page.screenshot({ path: 'test-results/screens/compare.png', fullPage: true });
});

test('pages carry no console errors for the viewer either', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'viewer@linkwright.test');
	for (const path of ['/', '/cars/00000000-0000-4000-8000-00000000ca01', FRONT_LEFT, `${FRONT_LEFT}/compare`, '/account', '/docs/api']) {
		await page.goto(path);
		await expect(page.locator('main')).toBeVisible();
	}
	expect(errors).toEqual([]);
});

test('a study keeps the sweep settings and overlays and reopens them', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.getByTestId('sweep-kind').selectOption('roll');
	await page.getByLabel('Study name').fill('roll check');
	await page.getByRole('button', { name: 'Save study' }).click();
	await expect(page.getByTestId('study-message')).toHaveText('Saved study “roll check”.');
	await page.reload();
	await expect(page.getByTestId('sweep-kind')).toHaveValue('heave');
	await page.getByTestId('open-study').selectOption({ label: 'roll check' });
	await expect(page.getByTestId('sweep-kind')).toHaveValue('roll');
	await expect(page.getByTestId('chart-camber-to-ground')).toBeVisible();
});
