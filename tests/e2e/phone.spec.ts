// On a phone (390 px wide, the width of a common phone in portrait; no standard names it: common practice) and a
// portrait tablet (768 px): the fabricator's share sheet shows every column of the coordinate table inside the
// window, the axle sheet too, the workspace's coordinate inputs are whole, and the compare page does not spill
// sideways. Each journey makes its own car. Screenshots go to test-results/screens/ for a person to look at.
import { readFileSync } from 'node:fs';
import { expect, test, type APIRequestContext, type Locator, type Page } from '@playwright/test';
import { signIn } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const moved = structuredClone(stock);
moved.points['steer.inner'] = [-145, 358, 196];
const DEMO_CAR_REVISION = '00000000-0000-4000-8000-0000000c0201';

/** A car with a stock baseline and a moved revision with adopted tolerances, shared: the sheet's URL and the corner. */
async function sharedSheet(request: APIRequestContext) {
	const car = await (await request.post('/api/v1/cars', { data: { name: `Phone sheet car ${Date.now()}` } })).json();
	const corner = await (await request.post(`/api/v1/cars/${car.id}/corners`, { data: { position: 'front_left', kind: 'double_wishbone' } })).json();
	const r1 = await (await request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'stock', note: '', geometry: stock } })).json();
	const r2 = await (await request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'rack moved', note: 'Rack up and back', geometry: moved } })).json();
	expect((await request.put(`/api/v1/corners/${corner.id}/baseline`, { data: { revisionId: r1.id } })).ok()).toBe(true);
	const study = await (await request.post(`/api/v1/corners/${corner.id}/studies`, { data: { name: 'tolerances', settings: { sweep: 'heave', from: -40, to: 40, step: 2 } } })).json();
	const adopted = await request.put(`/api/v1/corners/${corner.id}/studies/${study.id}/tolerances`, {
		data: { revisionId: r2.id, points: { 'steer.inner': { mm: 0.5, mode: 'axis' }, 'steer.outer': { mm: 0.25, mode: 'sphere' } } }
	});
	expect(adopted.ok()).toBe(true);
	const share = await (await request.post(`/api/v1/revisions/${r2.id}/shares`, { data: { expiresInDays: 5, note: 'Weld the new rack brackets' } })).json();
	return { url: share.url as string, cornerId: corner.id as string };
}

/** The boxes of the locator's elements that are not wholly inside 0…width (with a tolerance of half a pixel). */
async function outside(list: Locator, width: number) {
	const boxes = await list.evaluateAll((els) => els.map((e) => { const r = e.getBoundingClientRect(); return { left: r.left, right: r.right, text: e.textContent?.trim() ?? '' }; }));
	return boxes.filter((b) => b.left < -0.5 || b.right > width + 0.5);
}

/** The page's sideways overflow in px (0 = nothing to scroll sideways). */
const overflow = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

for (const width of [390, 768]) {
	test(`the share sheet shows every column within ${width} px, and its 3-D view's buttons are clear of the read-out`, async ({ page, browser }) => {
		await signIn(page, 'engineer@linkwright.test');
		const { url } = await sharedSheet(page.request);
		const guest = await browser.newContext({ viewport: { width, height: 844 } });
		const sheet = await guest.newPage();
		await sheet.goto(url);
		const table = sheet.getByTestId('sheet-table');
		const row = table.locator('tr[data-point="steer.inner"]');
		// x, y, z, Δx, Δy, Δz and the tolerance: seven cells, every one inside the window
		await expect(row.locator('td')).toHaveCount(7);
		await expect(row.locator('td')).toHaveText(['-145.0', '358.0', '196.0', '-15.0', '0.0', '+20.0', /^±0\.5 each axis$/]);
		expect(await outside(table.locator('td, th'), width)).toEqual([]);
		// every column says what it is, on a phone beside its figure
		for (const name of ['x', 'Δx', 'Tolerance']) await expect(row.locator(`td[data-label^="${name}"]`)).toHaveCount(1);
		expect(await overflow(sheet)).toBe(0);
		await sheet.getByTestId('linkage-canvas').scrollIntoViewIfNeeded();
		await expect(sheet.getByTestId('linkage-readout')).toBeVisible();
		const buttons = (await sheet.getByRole('group', { name: 'Preset views' }).boundingBox())!;
		const readout = (await sheet.getByTestId('linkage-readout').boundingBox())!;
		const apart = buttons.x >= readout.x + readout.width || readout.y + readout.height <= buttons.y || buttons.y + buttons.height <= readout.y;
		expect(apart).toBe(true);
		await sheet.screenshot({ path: `test-results/screens/share-sheet-${width}.png`, fullPage: true });
		await guest.close();
	});

	test(`the axle sheet fits ${width} px`, async ({ page, browser }) => {
		await signIn(page, 'engineer@linkwright.test');
		const res = await page.request.post(`/api/v1/car-revisions/${DEMO_CAR_REVISION}/shares`, { data: { axle: 'front', expiresInDays: 2 } });
		expect(res.status()).toBe(201);
		const guest = await browser.newContext({ viewport: { width, height: 844 } });
		const sheet = await guest.newPage();
		await sheet.goto((await res.json()).url);
		await expect(sheet.getByRole('heading', { level: 1 })).toBeVisible();
		expect(await outside(sheet.locator('table td, table th'), width)).toEqual([]);
		expect(await overflow(sheet)).toBe(0);
		await sheet.screenshot({ path: `test-results/screens/axle-sheet-${width}.png`, fullPage: true });
		await guest.close();
	});

	test(`the workspace's coordinate inputs are whole and the compare page fits at ${width} px`, async ({ page }) => {
		await page.setViewportSize({ width, height: 844 });
		await signIn(page, 'engineer@linkwright.test');
		const { cornerId } = await sharedSheet(page.request);
		await page.goto(`/corners/${cornerId}`);
		const inputs = page.locator('table[aria-label="Pickup points (mm, vehicle axes)"] input');
		await expect(inputs.first()).toHaveValue(/\d/);
		expect(await inputs.count()).toBeGreaterThan(30);
		// whole: the text fits its box (nothing scrolled out of sight) and the box is inside the window
		const cut = await inputs.evaluateAll((els) =>
			(els as HTMLInputElement[]).filter((e) => e.scrollWidth > e.clientWidth || e.getBoundingClientRect().right > window.innerWidth || e.getBoundingClientRect().left < 0).map((e) => `${e.getAttribute('aria-label')}: ${e.value}`)
		);
		expect(cut).toEqual([]);
		expect(await overflow(page)).toBe(0);
		await page.screenshot({ path: `test-results/screens/workspace-${width}.png`, fullPage: true });

		await page.goto(`/corners/${cornerId}/compare`);
		await expect(page.getByTestId('chart-toe')).toBeVisible();
		expect(await overflow(page)).toBe(0);
		await page.screenshot({ path: `test-results/screens/compare-${width}.png`, fullPage: true });
	});
}
