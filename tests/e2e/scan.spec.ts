// The scan journey (issue 17): an engineer uploads a small synthetic scan of a corner (tooling balls on three chassis
// points and the lower ball joint 2 mm higher than the stock revision, in a scanner's own axes and in metres,
// tests/scan-files), aligns it by three datum picks (a sphere fitted on each ball), fits a sphere on the ball joint,
// assigns it and saves a revision whose point list shows where the point came from. Goes through the local
// S3-compatible fake that `npm test` starts.
import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import { binaryStl, cornerScan, toScanFile } from '../scan-files';
import { settled, signIn } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const P = stock.points as Record<string, number[]>;
const moved = [P['lower.outer'][0], P['lower.outer'][1], P['lower.outer'][2] + 2];

/** Clicks the scan where a vehicle-axes point projects (the canvas's own camera), fits a sphere there. */
async function fitSphereAt(page: Page, at: number[]) {
	const xy = await page.getByTestId('scan-canvas').evaluate((c, p) => (c as HTMLCanvasElement & { lwScreenOf: (p: number[]) => { x: number; y: number } }).lwScreenOf(p), at);
	await page.mouse.click(xy.x, xy.y);
	await expect(page.getByTestId('pick')).toBeVisible();
	await page.getByRole('button', { name: 'Fit sphere' }).click();
	await expect(page.getByTestId('fit-rms')).toBeVisible();
}

test('an engineer uploads a scan, aligns it by three datums, fits the ball joint and saves a revision with provenance', async ({ page }) => {
	test.setTimeout(180_000);
	await signIn(page, 'engineer@linkwright.test');
	const car = await (await page.request.post('/api/v1/cars', { data: { name: `Scan journey ${Date.now()}` } })).json();
	const corner = await (await page.request.post(`/api/v1/cars/${car.id}/corners`, { data: { position: 'front_left', kind: 'double_wishbone' } })).json();
	expect((await page.request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'stock', note: '', geometry: stock } })).status()).toBe(201);

	const file = binaryStl(
		cornerScan([
			{ at: P['lower.front'], radius: 12 },
			{ at: P['lower.rear'], radius: 12 },
			{ at: P['upper.front'], radius: 12 },
			{ at: moved, radius: 15 }
		])
	);
	await page.goto(`/corners/${corner.id}`);
	await settled(page);
	await page.getByLabel('Scan file').setInputFiles({ name: 'front-left-scan.stl', mimeType: 'model/stl', buffer: Buffer.from(file) });
	await page.getByRole('button', { name: 'Upload scan' }).click();
	const item = page.locator('[data-scan="front-left-scan.stl"]');
	await expect(item.getByTestId('scan-status')).toHaveText('ready', { timeout: 60_000 });
	await expect(item).toContainText('binary STL');
	await page.screenshot({ path: 'test-results/scan-corner-panel.png', fullPage: true });
	await item.getByRole('link', { name: 'front-left-scan.stl' }).click();

	await expect(page.getByTestId('scan-canvas')).toHaveAttribute('data-ready', 'true', { timeout: 30_000 });
	// the file is in metres (the unit guessed from its size); not aligned yet, so "vehicle" axes are the scan's own, in mm
	await expect(page.getByLabel('Unit of the file')).toHaveValue('m');
	const datums: [string, string][] = [
		['lower.front', 'Lower arm, front pivot'],
		['lower.rear', 'Lower arm, rear pivot'],
		['upper.front', 'Upper arm, front pivot']
	];
	for (const [i, [name, label]] of datums.entries()) {
		await fitSphereAt(page, toScanFile(P[name]).map((v) => v * 1000));
		const letter = 'ABC'[i];
		await page.getByLabel(`Datum ${letter} point`).selectOption({ label });
		await page.getByRole('button', { name: `Use for datum ${letter}` }).click();
	}
	await page.getByRole('button', { name: 'Align by three datums' }).click();
	await expect(page.getByTestId('alignment-status')).toContainText('Aligned by three datums');
	const rms = Number(/RMS ([\d.]+) mm/.exec((await page.getByTestId('alignment-status').textContent()) ?? '')?.[1]);
	// the balls' centres are fitted, not picked: the datums land within a hundredth of a millimetre
	expect(rms).toBeLessThan(0.01);

	// now in vehicle axes: the ball joint where it was built
	await fitSphereAt(page, moved);
	await expect(page.getByTestId('fit-result')).toContainText('radius 15.00 mm');
	// fitted on the scan's own points read back from the bucket, not on the simplified preview
	await expect(page.getByTestId('fit-result')).toContainText('full resolution');
	await page.screenshot({ path: 'test-results/scan-view.png', fullPage: true });
	await page.getByLabel('Point to assign').selectOption({ label: 'Lower ball joint' });
	await page.getByRole('button', { name: 'Assign', exact: true }).click();
	await page.getByRole('button', { name: 'Save as a new revision' }).click();
	await page.getByRole('status').getByRole('link', { name: 'r2' }).click();

	const row = page.locator('tr[data-point="lower.outer"]');
	await expect(row.getByTestId('point-source')).toContainText('scan front-left-scan.stl · sphere fit · RMS');
	const cells = await row.locator('td.figure').allTextContents();
	cells.forEach((c, i) => expect(Math.abs(Number(c) - moved[i])).toBeLessThan(0.05));
	await expect(page.locator('tr[data-point="lower.front"]').getByTestId('point-source')).toHaveText('entered');
	await page.screenshot({ path: 'test-results/scan-revision.png', fullPage: true });

	// the fabricator's sheet says the same
	const revisionId = new URL(page.url()).pathname.split('/').pop();
	const share = await (await page.request.post(`/api/v1/revisions/${revisionId}/shares`, { data: { note: '' } })).json();
	await page.goto(new URL(share.url).pathname);
	await expect(page.locator('tr[data-point="lower.outer"]').getByTestId('point-source')).toContainText('scan front-left-scan.stl · sphere fit');
});

test('from the car page a scan is uploaded for a chosen corner; a cancelled upload leaves nothing', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	const car = await (await page.request.post('/api/v1/cars', { data: { name: `Scan car page ${Date.now()}` } })).json();
	await page.request.post(`/api/v1/cars/${car.id}/corners`, { data: { position: 'front_left', kind: 'double_wishbone' } });
	await page.goto(`/cars/${car.id}`);
	await settled(page);
	const file = { name: 'slow.stl', mimeType: 'model/stl', buffer: Buffer.from(binaryStl(cornerScan([{ at: [0, 0, 0], radius: 20 }]))) };
	// no corner chosen: the panel says which field is missing and sends nothing
	await page.getByLabel('Scan file').setInputFiles(file);
	await page.getByRole('button', { name: 'Upload scan' }).click();
	await expect(page.getByRole('alert')).toHaveText('corner: choose the corner the scan is of');
	// the part's PUT to object storage is held back, so the upload can be cancelled half-way
	await page.route(/\/linkwright-scans\//, async (route) => {
		await new Promise((r) => setTimeout(r, 3000));
		await route.continue().catch(() => undefined);
	});
	await page.getByLabel('Corner of the scan').selectOption({ label: 'Front left' });
	await page.getByLabel('Scan file').setInputFiles(file);
	await page.getByRole('button', { name: 'Upload scan' }).click();
	await page.getByRole('button', { name: 'Cancel upload' }).click();
	await expect(page.getByRole('alert')).toHaveText('Upload cancelled; nothing was kept.');
	const listed = await (await page.request.get(`/api/v1/cars/${car.id}/scans`)).json();
	expect(listed.scans).toEqual([]);
	await page.unroute(/\/linkwright-scans\//);
	// then a real one, listed with its corner
	await page.getByLabel('Scan file').setInputFiles({ ...file, name: 'ok.stl' });
	await page.getByRole('button', { name: 'Upload scan' }).click();
	await expect(page.locator('[data-scan="ok.stl"]').getByTestId('scan-status')).toHaveText('ready', { timeout: 60_000 });
	await expect(page.locator('[data-scan="ok.stl"]')).toContainText('Front left');
});
