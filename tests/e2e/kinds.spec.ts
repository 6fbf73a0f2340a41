import { expect, test, type Page } from '@playwright/test';
import { settled, signIn } from './helpers';

// The general model's kinds in the app: a pushrod corner from the template, a five-link import with the
// trade's names, and the fix search freeing a rocker point. The demo cars are invented (scripts/seed.ts).
const SINGLE_SEATER = '/cars/00000000-0000-4000-8000-00000000ca02';
const FIVE_LINK = '/corners/00000000-0000-4000-8000-0000000002e1';
const PUSHROD = '/corners/00000000-0000-4000-8000-0000000002f1';

test.describe.configure({ timeout: 120_000 });

/** Collects console errors of a page. */
function consoleErrors(page: Page) {
	const errors: string[] = [];
	page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
	page.on('pageerror', (e) => errors.push(e.message));
	return errors;
}

/** The plotted path of a series, as text. */
async function path(page: Page, chart: string, series = 'draft') {
	return (await page.getByTestId(`chart-${chart}`).locator(`path[data-series="${series}"]`).first().getAttribute('d')) ?? '';
}

test('an engineer starts a pushrod corner from the template, moves a rocker point and sees the motion ratio and the 3-D rocker follow', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(SINGLE_SEATER);
	// the front right is still free on the demo single-seater (a second run finds it made and opens it)
	const fresh = (await page.getByLabel('Position').locator('option[value="front_right"]').count()) > 0;
	if (fresh) {
		await page.getByLabel('Position').selectOption('front_right');
		await page.getByLabel('Suspension kind').selectOption('double_wishbone');
		await page.getByRole('button', { name: 'Add corner' }).click();
	} else await page.getByRole('link', { name: /Front right/ }).click();
	await expect(page.getByRole('heading', { name: /Front right/ })).toBeVisible({ timeout: 20_000 });
	await settled(page);
	// a new corner's first words say what to do, not an internal field name (a second run against the same
	// database finds the corner made and its template in; npm test starts from a fresh database)
	if (fresh) await expect(page.getByTestId('workspace-problem')).toHaveText('Not solved yet: type or paste the pickup points in the table (mm, vehicle axes), or import a CSV: the curves appear once every point has its coordinates.');

	await page.getByTestId('rocker-toggle').check();
	await expect(page.getByLabel('Rocker, rod joint, z in mm')).toBeVisible();
	page.once('dialog', (d) => d.accept());
	await page.getByTestId('use-template').click();
	await expect(page.getByLabel("Rod's outer joint is on")).toHaveValue('lower');
	// the right corner: the template is mirrored (y < 0)
	expect(Number(await page.getByLabel('Rocker, rod joint, y in mm').inputValue())).toBeLessThan(0);

	const mr = page.getByTestId('chart-motion-ratio');
	await expect(mr.locator('path[data-series="draft"]')).toHaveCount(1, { timeout: 20_000 });
	await expect(page.getByTestId('chart-rocker-angle').locator('path[data-series="draft"]')).toHaveCount(1);
	const canvas = page.getByTestId('linkage-canvas');
	await expect(canvas).toBeVisible();
	const before = await path(page, 'motion-ratio');
	const rockerBefore = await path(page, 'rocker-angle');
	await expect.poll(() => canvas.getAttribute('data-draws'), { timeout: 20_000 }).not.toBeNull();
	const draws = await canvas.getAttribute('data-draws');

	// move the rod joint 15 mm further out on the rocker (up): a shorter ratio, a smaller rocker swing
	const z = page.getByLabel('Rocker, rod joint, z in mm');
	await z.fill(String(Number(await z.inputValue()) + 15));
	await expect.poll(() => path(page, 'motion-ratio')).not.toBe(before);
	await expect.poll(() => path(page, 'rocker-angle')).not.toBe(rockerBefore);
	await expect.poll(() => canvas.getAttribute('data-draws')).not.toBe(draws);

	await page.getByLabel('Label').fill('pushrod from template');
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	await expect(page.getByTestId('saved')).toBeVisible();
	await expect(page.getByText(/Showing r\d+ “pushrod from template”/)).toBeVisible();
	await expect(page.getByTestId('rocker-toggle')).toBeChecked();
	await page.screenshot({ path: 'test-results/screens/pushrod-template.png', fullPage: true });
	expect(errors).toEqual([]);
});

test("an engineer imports a five-link point list written with the trade's names", async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FIVE_LINK);
	await page.getByRole('link', { name: 'Import CSV' }).click();
	await settled(page);
	// the stock five-link (fixtures/single-seater-rear-left-five-link.json) with the toe link 3 mm lower, named as a drawing would
	const csv = [
		'name,x,y,z',
		'Upper front link inner,-2480,280,340',
		'Upper front link outer,-2680,560,385',
		'Upper rear link inner,-2860,285,350',
		'Upper rear link outer,-2735,560,395',
		'LFL inner,-2450,230,115',
		'LFL outer,-2660,580,105',
		'Lower rear link inner,-2850,240,90',
		'Lower rear link outer,-2740,585,110',
		'Toe link inner,-2840,218,138',
		'Toe link outer,-2830,590,160',
		'Wheel center,-2700,610,279.904',
		'Hub inner,-2700.174,510.034,277.286',
		'Shock top,-2720,260,430',
		'Shock bottom,-2705,540,150'
	].join('\n');
	await page.getByLabel('CSV file (at most 5 MB)').setInputFiles({ name: 'five-link-drawing.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
	// the team's last import may have been in inches (the page remembers it): this drawing is in mm
	await page.getByLabel('Units in the file').selectOption('mm');
	await page.getByRole('button', { name: 'Preview' }).click();
	for (const [ours, theirs] of [
		['upper_front.inner', 'Upper front link inner'],
		['lower_front.outer', 'LFL outer'],
		['steer.inner', 'Toe link inner'],
		['wheel.axis_inner', 'Hub inner'],
		['spring.body', 'Shock bottom']
	]) {
		await expect(page.locator(`tr[data-point="${ours}"]`)).toContainText(theirs);
	}
	await page.getByLabel('Label').fill('drawing import');
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	await expect(page.getByText(/Showing r\d+ “drawing import” \(latest\)/)).toBeVisible({ timeout: 20_000 });
	// best fit onto the stock revision spreads the 3 mm move a little over the other points
	expect(Math.abs(Number(await page.getByLabel('Tie rod or toe link, inner joint, z in mm').inputValue()) - 138)).toBeLessThan(1);
	await expect(page.getByTestId('chart-toe').locator('path[data-series="draft"]')).toHaveCount(1, { timeout: 20_000 });
	expect(errors).toEqual([]);
});

test('the fix search frees a rocker point to bring back the stock rocker swing', async ({ page }) => {
	const errors = consoleErrors(page);
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(PUSHROD);
	await page.locator('[data-revision="2"]').getByRole('link', { name: 'Start from this' }).click();
	await expect(page.getByText(/Showing r2 “rod end out 10 mm”/)).toBeVisible({ timeout: 20_000 });
	await page.getByRole('link', { name: 'Fix search' }).click();
	await expect(page.getByRole('heading', { name: 'Fix search' })).toBeVisible({ timeout: 20_000 });
	await settled(page);

	for (const coord of ['rocker.rod_end y', 'rocker.rod_end z']) {
		await page.getByLabel(`Move ${coord}`).check();
		await page.getByLabel(`Bound ${coord} (mm)`).fill('20');
	}
	for (const m of ['toe', 'camber']) await page.getByLabel(`Fit ${m}`).uncheck();
	await page.getByLabel('Fit rocker_angle').check();
	await page.getByLabel('Target revision').selectOption({ label: 'r1 stock (baseline)' });
	await page.getByRole('button', { name: 'Run fix search' }).click();

	const after = page.getByTestId('max-after-rocker_angle');
	await expect(after).toBeVisible({ timeout: 30_000 });
	// Regression figure of the invented demo, no outside source: r2 swings about 1.5° less than stock at ±40 mm;
	// moving the rod joint back brings it within 0.1° (the search's own error is about 1e-4°, npm run bench)
	expect(Number((await after.textContent())!.replace('°', ''))).toBeLessThan(0.1);
	await expect(page.getByTestId('fix-note')).toContainText('rocker.rod_end');
	await expect(page.getByTestId('chart-rocker-angle-change').locator('path[data-series="after"]')).toHaveCount(1);
	await page.screenshot({ path: 'test-results/screens/fix-rocker.png', fullPage: true });
	expect(errors).toEqual([]);
});
