// The car's screens: both axles and the body in one 3-D view with the steering turning the front wheels; two car
// revisions compared (what changed, and both revisions' lines on the axle charts); a solid rear axle edited on the
// page, a bad value refused naming the field with nothing saved, a good one saved as a new revision.
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { settled, signIn } from './helpers';

const SINGLE_SEATER = '00000000-0000-4000-8000-00000000ca02';
const num = (text: string | null) => Number((text ?? '').replace(/[−–]/g, '-').replace(/[^0-9.\-]/g, ''));
const fixture = (name: string) => ({ format: 'corner-geometry/1', ...JSON.parse(readFileSync(`fixtures/${name}.json`, 'utf8')) });

/** A car of the test's own (the demo car is saved over by other journeys running beside): its corners' first revisions and a first car revision. */
async function freshCar(page: Page, name: string, corners: Record<string, [string, unknown]>, model: unknown) {
	const car = await (await page.request.post('/api/v1/cars', { data: { name: `${name} ${Date.now()}`, driveLayout: 'rwd' } })).json();
	for (const [position, [kind, geometry]] of Object.entries(corners)) {
		const corner = await (await page.request.post(`/api/v1/cars/${car.id}/corners`, { data: { position, kind } })).json();
		expect((await page.request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'stock', note: '', geometry } })).status()).toBe(201);
	}
	const rev = await page.request.post(`/api/v1/cars/${car.id}/revisions`, { data: { label: 'stock', model } });
	expect(rev.status()).toBe(201);
	return { carId: car.id as string, revisionId: (await rev.json()).id as string };
}

const roadWheels = async (page: Page) => [...((await page.getByTestId('steering-readout').textContent()) ?? '').matchAll(/road wheel ([+−][\d.]+)°/g)].map((m) => num(m[1]));

test('the 3-D view draws both axles and the body; the steering wheel turns the front road wheels', async ({ page }) => {
	await signIn(page, 'viewer@linkwright.test');
	await page.goto(`/cars/${SINGLE_SEATER}/model`);
	await settled(page);
	const view = page.getByTestId('car-view');
	await expect(view).toHaveAttribute('data-drawn', 'front rear body');
	const legend = page.getByTestId('car-view-legend');
	await expect(legend).toContainText(/Front double wishbone, both sides, steered/);
	await expect(legend).toContainText(/Rear five-link, both sides, at design/);
	await expect(legend).toContainText(/CG \d+ mm high/);
	await expect(page.getByTestId('steering-readout')).toContainText('wheel +0.0°');
	const [left0, right0] = await roadWheels(page);
	expect(left0).toBe(0);
	expect(right0).toBe(0);
	const slider = page.getByTestId('steering-slider');
	const max = Number(await slider.getAttribute('max'));
	// a quarter turn of the steering wheel to the right (ISO 8855: − = right)
	await slider.fill(String(max / 2 - 9));
	await expect(page.getByTestId('steering-readout')).toContainText('wheel −90.0°');
	const [left, right] = await roadWheels(page);
	expect(left).toBeLessThan(0);
	expect(right).toBeLessThan(0);
	// the inner wheel of a right turn is the right one: it turns further with this linkage's Ackermann
	expect(Math.abs(right)).toBeGreaterThan(Math.abs(left));
});

test('comparing two car revisions after moving the engine lists the moved item with its Δx and draws both on the charts', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	const { carId, revisionId: before } = await freshCar(
		page,
		'Compare e2e',
		{ front_left: ['double_wishbone', fixture('single-seater-front-left-pushrod')], rear_left: ['multi_link', fixture('single-seater-rear-left-five-link')] },
		{
			format: 'car-model/1',
			mass_items: [
				{ name: 'Chassis and bodywork', mass: 175, x: -1250, y: 0, z: 290 },
				{ name: 'Engine and gearbox', mass: 105, x: -1950, y: 0, z: 250 },
				{ name: 'Driver', mass: 72, x: -1150, y: 0, z: 240 }
			],
			front: { unsprung_mass: 14, spring_rate: 90, tyre_rate: 250, right: 'mirror', steering: { rack_travel_per_turn: 60, rack_left_turn: '+y' } },
			rear: { unsprung_mass: 16, spring_rate: 110, tyre_rate: 260, right: 'mirror' }
		}
	);
	await page.goto(`/cars/${carId}/model`);
	await settled(page);
	const x = page.getByLabel('Engine and gearbox x (mm)');
	await x.fill(String(Number(await x.inputValue()) - 100));
	await page.getByLabel('Label').fill('engine back for compare');
	const save = page.getByRole('button', { name: /Save as revision c\d+/ });
	await expect(save).toHaveText('Save as revision c2');
	await save.click();
	await expect(page.getByRole('heading', { name: 'Revision c2 · engine back for compare' })).toBeVisible();
	const after = new URL(page.url()).searchParams.get('rev')!;
	// the comparison is an address: open it afresh
	await page.goto(`/cars/${carId}/model?rev=${after}&vs=${before}`);
	await settled(page);
	const changes = page.getByTestId('car-changes');
	const engine = changes.locator('li[data-change="Engine and gearbox"]');
	await expect(engine).toContainText('moved');
	await expect(engine.getByTestId('Δx')).toHaveText('Δx −100.0 mm');
	await expect(engine.getByTestId('Δy')).toHaveCount(0);
	await expect(engine.getByTestId('Δmass')).toHaveCount(0);
	// nothing else was touched
	await expect(changes.locator('li')).toHaveCount(1);
	const ackermann = page.getByTestId('chart-ackermann');
	await expect(ackermann.locator('path[data-series="ackermann"]')).toHaveCount(1);
	await expect(ackermann.locator('path[data-series="ackermann-vs"]')).toHaveCount(1);
	const height = page.getByTestId('chart-roll-centre-height');
	await expect(height.locator('path[data-series="front"]')).toHaveCount(1);
	await expect(height.locator('path[data-series="front-vs"]')).toHaveCount(1);
});

test('a solid rear axle edited on the page: a bad value is refused naming the field and saves nothing, a good one makes a new revision', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	// a car of its own: a front corner, and a first revision with a solid rear axle (as the API takes it)
	const solid = JSON.parse(readFileSync('fixtures/invented-solid-rear-axle.json', 'utf8')).solid;
	for (const p of Object.values(solid.points) as number[][]) p[0] -= 2700;
	const { carId } = await freshCar(
		page,
		'Live axle e2e',
		{ front_left: ['double_wishbone', fixture('single-seater-front-left-pushrod')] },
		{
			format: 'car-model/1',
			mass_items: [
				{ name: 'Body', mass: 900, x: -1300, y: 0, z: 450 },
				{ name: 'Engine', mass: 160, x: -300, y: 0, z: 380 }
			],
			front: { unsprung_mass: 30, spring_rate: 40, tyre_rate: 220, right: 'mirror', steering: { rack_travel_per_turn: 50, rack_left_turn: '+y' } },
			rear: { unsprung_mass: 55, spring_rate: 30, tyre_rate: 220, right: 'mirror', solid }
		}
	);

	await page.goto(`/cars/${carId}/model`);
	await settled(page);
	await expect(page.getByTestId('rear-axle-type')).toHaveValue('solid');
	await expect(page.getByTestId('car-view-legend')).toContainText('Rear solid axle, four links and a Panhard rod');
	const editor = page.getByTestId('solid-axle-editor');
	const options = page.locator('select[name="rev"] option');
	await expect(options).toHaveCount(1);

	// bad: a loaded radius of zero (the schema's own message, field named from the form's root as the API does)
	await editor.getByLabel('solid axle loaded radius (mm)').fill('0');
	await page.getByRole('button', { name: 'Save as revision c2' }).click();
	await expect(page.getByTestId('save-error')).toHaveText('model.rear.solid.tyre.loaded_radius: must be > 0');
	// bad: the Panhard rod's axle end moved onto its chassis end (a zero-length rod)
	await editor.getByLabel('solid axle loaded radius (mm)').fill('300');
	const chassisEnd = solid.points['panhard.chassis'] as number[];
	for (const [i, axis] of ['x', 'y', 'z'].entries()) await editor.getByLabel(`panhard.axle ${axis} (mm)`).fill(String(chassisEnd[i]));
	await page.getByRole('button', { name: 'Save as revision c2' }).click();
	await expect(page.getByTestId('save-error')).toHaveText('model.rear.solid.points.panhard.axle: link panhard has zero length');
	await expect(editor.locator('tr[data-point="panhard.axle"]')).toHaveClass(/bg-bad/);
	// nothing was saved
	await page.reload();
	await settled(page);
	await expect(options).toHaveCount(1);

	// good: the rod's axle end 10 mm higher than it was
	const axleEnd = solid.points['panhard.axle'] as number[];
	await editor.getByLabel('panhard.axle z (mm)').fill(String(axleEnd[2] + 10));
	await page.getByLabel('Label').fill('Panhard 10 mm up');
	await page.getByRole('button', { name: 'Save as revision c2' }).click();
	await expect(page.getByRole('heading', { name: 'Revision c2 · Panhard 10 mm up' })).toBeVisible();
	await expect(options).toHaveCount(2);
	const change = page.getByTestId('car-changes').locator('li[data-change="rear.solid.points.panhard.axle"]');
	await expect(change).toContainText('Rear solid axle point panhard.axle');
	await expect(change).toContainText('moved 10.0 mm');
});

test('ride height and rake: the front lowered more than the rear, every corner’s new figures and the rake, saved at once', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	const car = await (await page.request.post('/api/v1/cars', { data: { name: `Rake ${Date.now()}`, wheelbaseMm: 2600 } })).json();
	const carId = car.id as string;
	for (const [position, kind, name] of [['front_left', 'double_wishbone', 'single-seater-front-left'], ['rear_left', 'multi_link', 'single-seater-rear-left-five-link']]) {
		const corner = await (await page.request.post(`/api/v1/cars/${carId}/corners`, { data: { position, kind } })).json();
		expect((await page.request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'stock', note: '', geometry: fixture(name) } })).status()).toBe(201);
	}
	await page.goto(`/cars/${carId}`);
	await page.getByTestId('car-ride-height-link').click();
	await expect(page.getByRole('heading', { name: 'Ride height and rake' })).toBeVisible();
	await page.getByLabel('Front change (mm)').fill('-15');
	await page.getByLabel('Rear change (mm)').fill('-5');
	await page.getByRole('button', { name: 'Show the new design positions' }).click();
	await expect(page.getByTestId('rake')).toContainText('nose down');
	await expect(page.getByTestId('after-front_left-camber')).toBeVisible();
	await expect(page.getByTestId('after-rear_left-camber')).toBeVisible();
	await page.screenshot({ path: 'test-results/screens/car-ride-height.png', fullPage: true });
	await page.getByRole('button', { name: 'Save a new revision of every changed corner' }).click();
	await expect(page.getByTestId('car-ride-height-saved')).toContainText('Saved 2 revisions');
});
