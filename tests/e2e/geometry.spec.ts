import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { settled, signIn } from './helpers';

const FRONT_LEFT = '/corners/00000000-0000-4000-8000-0000000000f1';
const stock = JSON.parse(readFileSync('fixtures/demo/front-left-stock.json', 'utf8'));

test('the engineer imports the inch scanner CSV, aligns it onto the baseline and saves it', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.getByRole('link', { name: 'Import CSV' }).click();
	await page.getByLabel('CSV file (at most 5 MB)').setInputFiles('fixtures/club-fwd-front-left-scan-inches.csv');
	await page.getByLabel('Units in the file').selectOption('in');
	await expect(page.getByLabel(/Best fit onto r1/)).toBeChecked();
	await page.getByRole('button', { name: 'Preview' }).click();
	await expect(page.getByTestId('alignment')).toContainText('best fit');
	await page.screenshot({ path: 'test-results/screens/import-preview.png', fullPage: true });
	for (const name of ['lower.front', 'upper.outer', 'steer.inner', 'wheel.centre']) {
		expect(Number(await page.getByTestId(`delta-${name}`).textContent())).toBeLessThan(0.1);
	}
	await page.getByLabel('Label').fill('scan import');
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	await expect(page).toHaveURL(new RegExp(`${FRONT_LEFT}$`));
	await expect(page.getByText(/Showing r\d+ “scan import” \(latest\)/)).toBeVisible();
	const x = await page.getByLabel('Lower arm, front pivot, x in mm').inputValue();
	expect(Number(x)).toBeCloseTo(stock.points['lower.front'][0], 1);
});

test('a bad CSV shows the message naming the row and column, and nothing is saved', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(`${FRONT_LEFT}/import`);
	await settled(page); // a file chosen before hydration is not read, and Preview stays disabled
	await page.getByLabel('CSV file (at most 5 MB)').setInputFiles({
		name: 'bad.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from('point,x,y,z\nlower.front,180,335,12;4\n')
	});
	await page.getByRole('button', { name: 'Preview' }).click();
	await expect(page.getByTestId('import-error')).toHaveText('row 2, column z: "12;4" is not a number');
});

test('editing a point and saving makes a new revision; a bad value is named inline', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto('/corners/00000000-0000-4000-8000-0000000000f2');
	const z = page.getByLabel('Tie rod, inner joint, z in mm');
	await z.fill('abc');
	await expect(page.locator('[data-point="steer.inner"]').getByRole('alert')).toHaveText('"abc" is not a number');
	await z.fill('196');
	await page.keyboard.press('Enter');
	await expect(page.getByLabel('Tie rod, outer joint, z in mm')).toBeFocused();
	await expect(page.getByTestId('unsaved')).toBeVisible();
	await page.getByLabel('Label').fill('rack up 20');
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	await expect(page.getByTestId('saved')).toContainText('Saved as r2');
	await expect(page.getByText('Showing r2 “rack up 20” (latest)')).toBeVisible();
	await expect(page.locator('[data-revision="1"]').getByTestId('baseline-badge')).toBeVisible();
});

test('a block pasted from a spreadsheet fills the table from the focused cell', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto('/corners/00000000-0000-4000-8000-0000000000f2');
	const first = page.getByLabel('Lower arm, front pivot, x in mm');
	await first.focus();
	await page.evaluate(() => {
		const data = new DataTransfer();
		data.setData('text/plain', '181\t-336\t128\n-221\t-346\t134\n');
		document.activeElement!.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
	});
	await expect(page.getByLabel('Lower arm, rear pivot, z in mm')).toHaveValue('134.0');
	await expect(page.getByLabel('Lower arm, front pivot, y in mm')).toHaveValue('-336.0');
});

test('the viewer reads the points but cannot edit, import or save', async ({ page }) => {
	await signIn(page, 'viewer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await expect(page.getByRole('table', { name: /Pickup points/ })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Save as new revision' })).toHaveCount(0);
	await expect(page.getByRole('link', { name: 'Import CSV' })).toHaveCount(0);
	await expect(page.getByRole('textbox', { name: /in mm$/ })).toHaveCount(0);
	const res = await page.goto(`${FRONT_LEFT}/import`);
	expect(res?.status()).toBe(403);
});

test('an old revision opens read only and can start a new one', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.getByRole('link', { name: 'r1 · stock' }).click();
	await expect(page.getByRole('heading', { name: /Revision 1 · stock/ })).toBeVisible();
	await expect(page.getByText(/read only/)).toBeVisible();
	await page.getByRole('link', { name: 'Start a new revision from this' }).click();
	await expect(page.getByText(/Showing r1 “stock” — the latest is r\d/)).toBeVisible();
	await page.screenshot({ path: 'test-results/screens/corner-editor.png', fullPage: true });
});

test('a typing slip is warned about beside the table before anything is saved, in words with the point’s label', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto('/corners/00000000-0000-4000-8000-0000000000f1');
	await settled(page);
	await expect(page.getByTestId('plausibility')).toHaveCount(0); // the demo corner has none
	const y = page.getByLabel('Tie rod, outer joint, y in mm');
	await y.fill('900'); // 180 mm outboard of the wheel centre
	await page.keyboard.press('Tab');
	const box = page.getByTestId('plausibility');
	await expect(box).toBeVisible();
	await expect(box.locator('li[data-rule="outside_wheel"]')).toContainText('Tie rod, outer joint (steer.outer) is');
	await page.screenshot({ path: 'test-results/screens/plausibility.png' });
});

test('the engineer lowers the car 15 mm at one corner, reads the new static figures and saves the new design position', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto('/corners/00000000-0000-4000-8000-0000000000f2');
	await settled(page);
	await page.getByRole('link', { name: 'Ride height' }).click();
	await expect(page.getByRole('heading', { name: 'Ride height' })).toBeVisible();
	await settled(page);
	await expect(page.getByTestId('caution')).toBeVisible();
	await page.getByLabel('Ride height change (mm)').fill('-15');
	await page.getByRole('button', { name: 'Show the new design position' }).click();
	const result = page.getByTestId('ride-height-result');
	await expect(result).toContainText('lowered 15 mm');
	await expect(result.locator('tr[data-figure="camber"]')).toBeVisible();
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	await expect(page.getByTestId('ride-height-saved')).toContainText(/Saved as r\d+/);
});

test('joint angles: an engineer reads every joint through the sweeps, tightens a limit, sees it judged and saves it', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.getByRole('link', { name: 'Joint angles' }).click();
	await expect(page.getByRole('heading', { name: 'Joint angles' })).toBeVisible();
	await expect(page.getByTestId('caution')).toBeVisible();
	const upper = page.locator('tr[data-joint="upper.outer"]');
	await expect(upper).toBeVisible();
	await expect(page.locator('tr[data-joint="steer.inner"]')).toContainText('rod end, tie rod');
	await expect(page.getByTestId('joints-verdict')).toHaveText('Every joint within its limit');
	// three charts: heave, roll and steer
	await expect(page.getByRole('figure', { name: /^Joint angle in/ })).toHaveCount(3);
	await expect(page.getByTestId('chart-joint-angle-in-heave')).toBeVisible();
	const largest = Number((await upper.getByTestId('joint-max').textContent())!.replace('°', ''));
	expect(largest).toBeGreaterThan(1);
	await page.getByLabel('Limit of Upper ball joint (°)').fill('1');
	await expect(upper.getByTestId('joint-judged')).toContainText(`over by ${(largest - 1).toFixed(2)}°`);
	await expect(page.getByTestId('joints-verdict')).toContainText('1 over the limit: Upper ball joint');
	await page.screenshot({ path: 'test-results/screens/joint-angles.png', fullPage: true });
	await page.getByRole('button', { name: 'Save limits and axes for this corner' }).click();
	await expect(page.getByTestId('joints-saved')).toContainText('Saved: 1 joint');
	await page.reload();
	await expect(page.getByLabel('Limit of Upper ball joint (°)')).toHaveValue('1');
	// put the demo back as it was
	await page.getByLabel('Limit of Upper ball joint (°)').fill('');
	await page.getByRole('button', { name: 'Save limits and axes for this corner' }).click();
	await expect(page.getByTestId('joints-saved')).toContainText('Saved: 0 joints');
	// another revision: its own angles, from the page's load. The demo's r3 has the rack-moved tie-rod inner joint and a
	// 12 mm spacer under the outer one, r1 neither (fixtures/demo): the inner rod end's largest angle differs.
	const revision = page.getByRole('combobox', { name: 'Revision' });
	const inner = page.locator('tr[data-joint="steer.inner"]').getByTestId('joint-max');
	await revision.selectOption({ label: 'r3 spacer 12 mm' });
	await expect(page.getByRole('heading', { name: /^r3 spacer 12 mm: 6 joints$/ })).toBeVisible();
	const onR3 = await inner.textContent();
	await revision.selectOption({ label: 'r1 stock' });
	await expect(page.getByRole('heading', { name: /^r1 stock: 6 joints$/ })).toBeVisible();
	await expect(inner).not.toHaveText(onR3!);
});

test('combined motions: bump steer at lock as a map, and heave × roll', async ({ page }) => {
	await signIn(page, 'viewer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.getByRole('link', { name: 'Combined motions' }).click();
	await expect(page.getByRole('heading', { name: 'Combined motions' })).toBeVisible();
	await expect(page.getByRole('figure', { name: 'Toe change over the travel' })).toBeVisible();
	await expect(page.getByTestId('heat-map')).toHaveCount(2);
	// the read-out from the keyboard: the design cell's change is zero
	await page.getByTestId('heat-map').first().focus();
	await page.keyboard.press('ArrowRight');
	await expect(page.getByTestId('heat-map-readout').first()).toHaveText(/^Wheel travel 5.0 mm · Rack travel 0.0 mm → /);
	await page.screenshot({ path: 'test-results/screens/maps-heave-steer.png', fullPage: true });
	await page.getByRole('combobox', { name: 'Map' }).selectOption('heave_roll');
	await page.getByRole('button', { name: 'Solve' }).click();
	await expect(page.getByTestId('heat-map')).toHaveCount(3);
	await expect(page.getByRole('figure', { name: 'Camber to the ground change' })).toBeVisible();
});

test('inches: an engineer who works in inches reads and types the points in inches; the stored value is mm', async ({ page }) => {
	const stamp = Date.now();
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Invented Inch Engineer');
	await page.getByLabel('E-mail').fill(`inches-${stamp}@example.test`);
	await page.getByLabel('Password (at least 10 characters)').fill('a long inch secret');
	await page.getByLabel('Team name').fill(`Inch team ${stamp}`);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.getByRole('heading', { name: 'Cars' })).toBeVisible();
	await page.goto('/account');
	await page.getByLabel('Inches (in)').check();
	await page.getByRole('button', { name: 'Save units' }).click();
	await expect(page.getByTestId('unit-saved')).toHaveText('Lengths now in inches.');
	// a car and a corner with the invented club corner, through the API as this user
	const car = await (await page.request.post('/api/v1/cars', { data: { name: 'Inch car' } })).json();
	const corner = await (await page.request.post(`/api/v1/cars/${car.id}/corners`, { data: { position: 'front_left', kind: 'double_wishbone' } })).json();
	const geometry = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
	expect((await page.request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'stock', note: '', geometry } })).status()).toBe(201);
	await page.goto(`/corners/${corner.id}`);
	await settled(page);
	// steer.inner y = 358 mm = 14.094 in (÷ 25.4)
	const y = page.getByLabel('Tie rod, inner joint, y in in');
	await expect(y).toHaveValue((358 / 25.4).toFixed(3));
	await expect(page.getByRole('columnheader', { name: 'y (in)' })).toBeVisible();
	// the charts' lengths are in inches too
	await expect(page.getByText(/Half-track change \(in\)/).first()).toBeVisible();
	// the tyre's loaded radius: 290 mm = 11.417323 in (÷ 25.4, to a micro-inch), labelled in inches
	const radius = page.getByLabel('Tyre loaded radius (in)');
	await expect(radius).toHaveValue('11.417323');
	// the 3-D view reads out in inches (0.001 in) and its travel slider runs ±80 mm = ±3.150 in (80 ÷ 25.4 = 3.1496)
	await expect(page.getByTestId('linkage-readout')).toContainText(/RC height −?\d+\.\d{3} in/);
	await expect(page.getByTestId('linkage-readout')).toContainText(/FVIC (y −?\d+\.\d{3}, z −?\d+\.\d{3}|arm lines parallel) in/);
	await expect(page.getByTestId('linkage-position')).toContainText(/ 0\.000 in/);
	const slider = page.getByRole('slider', { name: 'Wheel travel, + bump position' });
	await slider.focus();
	await page.keyboard.press('End');
	await expect(page.getByTestId('linkage-position')).toContainText('+3.150 in');
	// the sweep's range is typed in inches too
	await expect(page.getByLabel('To (in)')).toHaveValue('3.149606');
	await y.fill('14.5');
	await page.keyboard.press('Tab');
	await radius.fill('11.4');
	await page.getByLabel('Label', { exact: true }).fill('inch edit');
	await page.getByRole('button', { name: 'Save as new revision' }).click();
	await expect(page.getByText(/Saved as r2/)).toBeVisible();
	const revs = await (await page.request.get(`/api/v1/corners/${corner.id}/revisions?limit=1`)).json();
	const saved = await (await page.request.get(`/api/v1/revisions/${revs.revisions[0].id}`)).json();
	expect(saved.geometry.points['steer.inner'][1]).toBeCloseTo(14.5 * 25.4, 9);
	// 11.4 in typed is 289.56 mm stored (× 25.4)
	expect(saved.geometry.tyre.loaded_radius).toBeCloseTo(289.56, 9);
	await page.screenshot({ path: 'test-results/screens/workspace-inches.png' });

	// the compare page in inches: positions ±1, ±2 in by default, the moved point's Δy in inches
	await page.goto(`/corners/${corner.id}/compare`);
	await expect(page.getByLabel('Travel positions for the figures (in, + bump)')).toHaveValue('-2, -1, 0, 1, 2');
	const figures = page.getByTestId('figures');
	for (const heading of ['-2', '-1', '0', '+1', '+2']) await expect(figures.getByRole('columnheader', { name: heading, exact: true })).toBeVisible();
	await expect(page.getByRole('heading', { name: /Points that moved/ })).toContainText('B − A, in');
	// Δy = 14.5 in − 358 mm ÷ 25.4 = 14.5 − 14.094488 = 0.406 in (to 0.001 in)
	const moved = page.getByTestId('moved-points').getByRole('row').filter({ hasText: 'steer.inner' });
	await expect(moved.getByRole('cell').nth(2)).toHaveText('0.406');
	await expect(figures.getByRole('rowheader', { name: 'Half-track change (in)' })).toBeVisible();
	// a position typed in inches: 1.5 in is 38.1 mm for the solve, shown back as +1.5
	await page.getByLabel('Travel positions for the figures (in, + bump)').fill('0, 1.5');
	await page.getByRole('button', { name: 'Show' }).click();
	await expect(figures.getByRole('columnheader', { name: '+1.5', exact: true })).toBeVisible();
	await page.screenshot({ path: 'test-results/screens/compare-inches.png' });

	// the study report in inches: the points (14.5 in typed), the moved Δy and the travel headings
	await page.goto(`/corners/${corner.id}/report`);
	const row = page.getByTestId('report-points').locator('[data-point="steer.inner"]');
	await expect(row.getByRole('cell').nth(2)).toHaveText('14.500');
	await expect(row.getByRole('cell').nth(5)).toHaveText('0.406');
	await expect(page.getByTestId('report-figures').getByRole('columnheader', { name: '+2', exact: true })).toBeVisible();
	await expect(page.getByRole('heading', { name: /Figures through heave/ })).toContainText('(in, + bump)');

	// a target typed in inches on the car page: a roll-centre band of ±0.5 in over ±1 in is stored as ±12.7 mm over ±25.4 mm
	await page.goto(`/cars/${car.id}`);
	await page.locator('select[name="measure"]').selectOption('rc_height');
	await page.getByLabel('Min').fill('-0.5');
	await page.getByLabel('Max').fill('0.5');
	await page.getByLabel('From (in)').fill('-1');
	await page.getByLabel('To (in)').fill('1');
	await page.getByRole('button', { name: 'Add target' }).click();
	await expect(page.getByTestId('car-targets')).toContainText('Roll-centre height change within ±0.500 in over -1…1 in');
	const stored = (await (await page.request.get(`/api/v1/cars/${car.id}`)).json()).targets[0];
	expect(stored.min).toBeCloseTo(-12.7, 9);
	expect(stored.max).toBeCloseTo(12.7, 9);
	expect(stored.from).toBeCloseTo(-25.4, 9);
	expect(stored.to).toBeCloseTo(25.4, 9);
});
