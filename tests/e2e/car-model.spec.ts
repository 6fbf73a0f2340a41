// The car as a car: an engineer moves the engine mass item 100 mm rearward and reads the new weight distribution
// beside the old; turns the steering wheel in the axle's 3-D view and reads both road-wheel angles.
import { expect, test } from '@playwright/test';
import { settled, signIn } from './helpers';

const SINGLE_SEATER = '00000000-0000-4000-8000-00000000ca02';
const num = (text: string | null) => Number((text ?? '').replace(/[−–]/g, '-').replace(/[^0-9.\-]/g, ''));

test('moving the engine 100 mm rearward shows the new front weight beside the old', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(`/cars/${SINGLE_SEATER}`);
	await page.getByTestId('car-model-link').click();
	await expect(page.getByRole('heading', { name: 'Car model' })).toBeVisible();
	await settled(page);
	await expect(page.getByTestId('caution')).toBeVisible();
	const figures = page.getByTestId('car-figures');
	const row = (label: string) => figures.locator(`tr[data-figure="${label}"]`);
	const frontBefore = num(await row('Front weight').getByTestId('now').textContent());
	const mass = num(await row('Total mass').getByTestId('now').textContent());
	const wheelbase = num(await row('Wheelbase').getByTestId('now').textContent());
	const engineMass = Number(await page.getByLabel('Engine and gearbox mass (kg)').inputValue());
	const x = page.getByLabel('Engine and gearbox x (mm)');
	const x0 = Number(await x.inputValue());
	await x.fill(String(x0 - 100));
	await page.getByLabel('Label').fill('engine 100 mm back');
	const save = page.getByRole('button', { name: /Save as revision c\d+/ });
	const next = /c(\d+)$/.exec((await save.textContent())!.trim())![1];
	await save.click();
	await expect(page.getByRole('heading', { name: `Revision c${next} · engine 100 mm back` })).toBeVisible();
	await settled(page);
	// the old figure now stands beside the new one; statics: Δ(front share) = −m·Δx / (M·L)
	expect(num(await row('Front weight').getByTestId('was').textContent())).toBeCloseTo(frontBefore, 2);
	const frontAfter = num(await row('Front weight').getByTestId('now').textContent());
	expect(frontAfter).toBeCloseTo(frontBefore - (100 * engineMass * 100) / (mass * wheelbase), 1);
	await expect(row('Front weight').getByTestId('delta')).toHaveText(/^−0\.\d\d$/);
	await expect(page.getByTestId('load-transfer')).toContainText('Front');
	// the whole car pitched about its CG: both axles' anti figures drawn
	const pitch = page.getByTestId('chart-anti-dive-and-anti-squat-through-pitch');
	await expect(pitch.locator('path[data-series="anti-dive"]')).toHaveCount(1);
	await expect(pitch.locator('path[data-series="anti-squat"]')).toHaveCount(1);
});

test('turning the steering wheel in the 3-D view turns both road wheels, the inner one more', async ({ page }) => {
	await signIn(page, 'viewer@linkwright.test');
	await page.goto(`/cars/${SINGLE_SEATER}/model`);
	await settled(page);
	const readout = page.getByTestId('steering-readout');
	await expect(readout).toContainText('wheel +0.0°');
	const slider = page.getByTestId('steering-slider');
	const max = Number(await slider.getAttribute('max'));
	await slider.fill(String(max));
	await expect(readout).toContainText('wheel +180.0°');
	const [left, right] = [...((await readout.textContent()) ?? '').matchAll(/road wheel ([+−][\d.]+)°/g)].map((m) => num(m[1]));
	// a left turn: both wheels steer left, the inner (left) one further with this linkage's Ackermann
	expect(left).toBeGreaterThan(0);
	expect(right).toBeGreaterThan(0);
	expect(left).toBeGreaterThan(right);
	await expect(page.getByText('Ackermann', { exact: true }).first()).toBeVisible();
});

test('the engineer shares the front axle; a fabricator without an account reads both sides on the sheet', async ({ page, browser }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(`/cars/${SINGLE_SEATER}/model`);
	await settled(page);
	const panel = page.getByTestId('axle-shares');
	await panel.getByLabel('Axle to share').selectOption('front');
	await panel.getByLabel('Note for the fabricator').fill('Front axle, for the jig');
	await panel.getByRole('button', { name: 'Make a read-only link' }).click();
	const link = page.getByTestId('axle-share-url');
	await expect(link).toBeVisible();
	const url = (await link.getAttribute('href'))!;
	await expect(page.getByTestId('axle-share-list')).toContainText('Front axle, for the jig');

	const fabricator = await browser.newContext();
	const sheet = await fabricator.newPage();
	await sheet.goto(url);
	await expect(sheet.getByRole('heading', { name: /Front axle/ })).toBeVisible();
	await expect(sheet.getByTestId('caution')).toBeVisible();
	for (const side of ['left', 'right']) await expect(sheet.getByTestId(`axle-side-${side}`).locator('tr[data-point="steer.outer"]')).toHaveCount(1);
	// the right side is the left one mirrored: same x and z, y of the other sign
	const cells = async (side: string) => (await sheet.getByTestId(`axle-side-${side}`).locator('tr[data-point="steer.outer"] td').allTextContents()).slice(1).map((t) => num(t));
	const [l, r] = [await cells('left'), await cells('right')];
	expect(r[0]).toBeCloseTo(l[0], 1);
	expect(r[1]).toBeCloseTo(-l[1], 1);
	expect(r[2]).toBeCloseTo(l[2], 1);
	await expect(sheet.getByTestId('axle-sheet-steering')).toBeVisible();
	await sheet.screenshot({ path: 'test-results/screens/axle-sheet.png', fullPage: true });
	// the fabricator switches to inches: the same points ÷ 25.4 (1 in = 25.4 mm, NIST SP 811) at 0.001 in, the link says so
	await sheet.getByRole('button', { name: 'in', exact: true }).click();
	await expect(sheet.getByTestId('axle-sheet-unit')).toContainText('inches');
	expect(new URL(sheet.url()).searchParams.get('unit')).toBe('in');
	const inches = await cells('left');
	for (let i = 0; i < 3; i++) expect(inches[i]).toBeCloseTo(l[i] / 25.4, 2);
	const csvHref = (await sheet.getByTestId('axle-sheet-csv').getAttribute('href'))!;
	expect(csvHref).toMatch(/\/csv\?unit=in$/);
	const csv = (await (await sheet.request.get(csvHref)).text()).trim().split(/\r?\n/);
	expect(csv[0]).toBe('side,point,description,x_in,y_in,z_in');
	await fabricator.close();
});
