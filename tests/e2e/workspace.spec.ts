import { readFileSync } from 'node:fs';
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
	const canvas = page.getByTestId('linkage-canvas');
	const draws = await canvas.getAttribute('data-draws');
	await page.getByLabel('Tie rod, outer joint, z in mm').fill('175');
	await expect.poll(async () => (await pathYs(page, 'toe', 'draft')).join(',')).not.toBe(before.join(','));
	// the 3-D view follows the charts with the edited corner's positions
	await expect.poll(() => canvas.getAttribute('data-draws')).not.toBe(draws);
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

	// The figures at positions of the engineer's choosing, off the 1 mm grid too; a bad list is named.
	const heads = page.getByTestId('figures').locator('thead th');
	await expect(heads).toHaveText(['Measure', '-50', '-25', '0', '+25', '+50']);
	await page.getByLabel('Travel positions for the figures (mm, + bump)').fill('−40, 37.5, 0, 40');
	await page.getByRole('button', { name: 'Show' }).click();
	await expect(heads).toHaveText(['Measure', '-40', '0', '+37.5', '+40']);
	await expect(page.getByRole('heading', { name: 'In short: r1 stock → r2 rack moved' })).toBeVisible();
	const toeRow = page.getByTestId('figures').locator('tbody tr', { hasText: 'Toe' }).first();
	await expect(toeRow.locator('td')).toHaveCount(4);
	await expect(toeRow.locator('td').nth(1)).toHaveText(/^-?\d+\.\d{3}\s*-?\d+\.\d{3}\s*-?\d+\.\d{3}$/);
	await page.getByLabel('Travel positions for the figures (mm, + bump)').fill('0, 300');
	await page.getByRole('button', { name: 'Show' }).click();
	await expect(page.getByTestId('positions-problem')).toContainText('at: 300 mm is beyond ±200 mm of travel');
	await expect(heads).toHaveText(['Measure', '-50', '-25', '0', '+25', '+50']);
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

test('on a tablet the workspace stays usable: side by side in landscape, charts straight after the table in portrait', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	const overflow = () => page.evaluate('document.documentElement.scrollWidth - document.documentElement.clientWidth');
	const box = async (testid: string) => (await page.getByTestId(testid).boundingBox())!;
	const tableBox = async () => (await page.locator('table[aria-label="Pickup points (mm, vehicle axes)"]').boundingBox())!;

	await page.setViewportSize({ width: 1024, height: 768 });
	await page.goto(FRONT_LEFT);
	await expect(page.getByTestId('linkage-canvas')).toBeVisible();
	expect(await overflow()).toBe(0);
	const [table, canvas] = [await tableBox(), await box('linkage-canvas')];
	expect(table.x + table.width).toBeLessThan(canvas.x); // beside each other
	expect(canvas.width).toBeGreaterThan(400);
	await page.screenshot({ path: 'test-results/screens/workspace-tablet-landscape.png' });

	await page.setViewportSize({ width: 768, height: 1024 });
	await page.goto(FRONT_LEFT);
	await expect(page.getByTestId('linkage-canvas')).toBeVisible();
	expect(await overflow()).toBe(0);
	const [t2, c2, toe, history] = [await tableBox(), await box('linkage-canvas'), await box('chart-toe'), (await page.getByRole('heading', { name: 'Revisions' }).boundingBox())!];
	expect(t2.y + t2.height).toBeLessThan(c2.y); // the 3-D view and charts follow the table
	expect(toe.y).toBeLessThan(history.y); // before the revision history
	await page.screenshot({ path: 'test-results/screens/workspace-tablet-portrait.png', fullPage: true });
});

test('one crosshair for all the workspace charts: hovering a travel in the toe chart shows it in the camber chart', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	const toe = page.getByTestId('chart-toe');
	await expect(toe.locator('path[data-series="draft"]')).toHaveCount(1);
	const camberX = page.getByTestId('chart-camber-readout').getByTestId('readout-x');
	// before: every read-out at the design position
	await expect(page.getByTestId('chart-camber-readout')).toContainText('Design');
	await toe.scrollIntoViewIfNeeded();
	const box = (await toe.boundingBox())!;
	await page.mouse.move(box.x + box.width * 0.8, box.y + box.height * 0.5);
	const toeX = await page.getByTestId('chart-toe-readout').getByTestId('readout-x').textContent();
	expect(Number.parseFloat((toeX ?? '').replace('\u2212', '-'))).toBeGreaterThan(10);
	await expect(page.getByTestId('chart-camber-readout')).toContainText('At');
	await expect(camberX).toHaveText(toeX!);
	// the crosshair line is drawn in the other chart too
	await expect(page.getByTestId('chart-camber').locator('line.lw-cross')).toHaveCount(1);
	// leaving the chart hides it everywhere
	await page.mouse.move(0, 0);
	await expect(page.getByTestId('chart-camber-readout')).toContainText('Design');
});

test('a corner with many revisions: the history pages and searches, the overlay picker finds any revision, the charts are in view at 1440 × 900', async ({ page }) => {
	test.setTimeout(150_000);
	await page.setViewportSize({ width: 1440, height: 900 });
	await signIn(page, 'engineer@linkwright.test');
	const geometry = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
	const car = await (await page.request.post('/api/v1/cars', { data: { name: `Many revisions ${Date.now()}` } })).json();
	const corner = await (await page.request.post(`/api/v1/cars/${car.id}/corners`, { data: { position: 'front_left', kind: 'double_wishbone' } })).json();
	const ids: string[] = [];
	for (let i = 1; i <= 26; i++) {
		const res = await page.request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: i === 4 ? 'old bracket' : `run ${i}`, note: i === 2 ? 'Bump steer at full lock' : '', geometry } });
		ids.push((await res.json()).id);
	}
	await page.goto(`/corners/${corner.id}`);
	const history = page.getByRole('list', { name: 'Revision history' });
	// one page of 20 (newest first), not the whole list
	await expect(history.locator('li[data-revision]')).toHaveCount(20);
	await expect(history.locator('li[data-revision]').first()).toHaveAttribute('data-revision', '26');
	await expect(page.getByTestId('revision-pager')).toContainText('1–20 of 26');
	await page.getByTestId('revision-pager').getByRole('button', { name: 'Older' }).click();
	await expect(history.locator('li[data-revision]')).toHaveCount(6);
	await expect(history.locator('li[data-revision]').last()).toHaveAttribute('data-revision', '1');
	// one request a page: nothing more is asked once the page is shown
	let asked = 0;
	page.on('request', (r) => r.url().includes(`/api/v1/corners/${corner.id}/revisions`) && asked++);
	await page.waitForTimeout(1000);
	expect(asked).toBe(0);
	// a search by the note's words
	await page.getByTestId('revision-search').fill('bump steer');
	await expect(history.locator('li[data-revision]')).toHaveCount(1);
	await expect(history.locator('li[data-revision]')).toHaveAttribute('data-revision', '2');

	// the overlay picker: the newest few at hand, no tick box per revision; an old one found by a search
	const picker = page.getByTestId('overlay-picker');
	expect(await picker.locator('input[type="checkbox"]').count()).toBeLessThanOrEqual(6);
	await page.getByTestId('overlay-search').fill('old bracket');
	const found = page.getByTestId('overlay-results').getByLabel('r4 old bracket');
	await found.check();
	await expect(page.getByTestId('chart-toe').locator(`path[data-series="${ids[3]}"]`)).toHaveCount(1);
	await expect(picker.getByLabel('r4 old bracket').first()).toBeChecked();

	// the charts are in view without scrolling: the first chart whole inside the window
	await page.evaluate(() => window.scrollTo(0, 0));
	const first = (await page.getByTestId('chart-camber').boundingBox())!;
	expect(first.y).toBeGreaterThan(0);
	expect(first.y + first.height).toBeLessThanOrEqual(900);
	await page.screenshot({ path: 'test-results/screens/corner-many-revisions-1440.png' });
});
