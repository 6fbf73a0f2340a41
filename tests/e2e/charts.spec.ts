import { readFileSync, writeFileSync } from 'node:fs';
import { expect, test, type Locator, type Page } from '@playwright/test';

/** The [x, y] pairs of an SVG path made of M and L commands. */
function pathPoints(d: string): [number, number][] {
	const nums = (d.match(/-?\d+(?:\.\d+)?/g) ?? []).map(Number);
	const out: [number, number][] = [];
	for (let i = 0; i + 1 < nums.length; i += 2) out.push([nums[i], nums[i + 1]]);
	return out;
}

/** The y spread (px) of a plotted path. */
function ySpread(points: [number, number][]): number {
	const ys = points.map((p) => p[1]);
	return Math.max(...ys) - Math.min(...ys);
}

/** The file a click on `button` downloads, as bytes. */
async function download(page: Page, button: Locator): Promise<{ name: string; bytes: Buffer }> {
	const [dl] = await Promise.all([page.waitForEvent('download'), button.click()]);
	return { name: dl.suggestedFilename(), bytes: readFileSync((await dl.path())!) };
}

test('toe and camber charts overlay stock and rack-moved curves with a read-out and exports', async ({ page }) => {
	const problems: string[] = [];
	page.on('console', (m) => {
		if (m.type() === 'error') problems.push(m.text());
	});
	page.on('pageerror', (e) => problems.push(e.message));

	await page.goto('/dev/charts');
	const toe = page.getByTestId('chart-toe');
	await expect(toe).toBeVisible();
	await expect(page.getByTestId('chart-camber')).toBeVisible();

	// the plotted curves: 101 positions (−50…50 by 1 mm), and the lowered rack gives far more bump steer
	const stockD = (await toe.locator('path[data-series="stock"]').getAttribute('d')) ?? '';
	const movedD = (await toe.locator('path[data-series="rack-moved"]').getAttribute('d')) ?? '';
	const stock = pathPoints(stockD);
	const moved = pathPoints(movedD);
	expect(stock.length).toBeGreaterThanOrEqual(100);
	expect(stock.length).toBeLessThanOrEqual(102);
	expect(moved.length).toBeGreaterThanOrEqual(100);
	expect(moved.length).toBeLessThanOrEqual(102);
	expect(ySpread(moved)).toBeGreaterThan(5 * Math.max(1, ySpread(stock)));
	await expect(page.getByText('Toe change ±0.10° over ±40 mm: not met')).toBeVisible();

	// hover: the read-out shows both series in degrees at the cursor
	const box = (await toe.boundingBox())!;
	await page.mouse.move(box.x + box.width * 0.75, box.y + box.height * 0.4);
	const readout = page.getByTestId('chart-toe-readout');
	await expect(readout).toContainText('At');
	await expect(readout.locator('[data-series="stock"]')).toContainText(/-?\u2212?\d+\.\d{3}°/);
	await expect(readout.locator('[data-series="rack-moved"]')).toContainText(/\d+\.\d{3}°/);
	const x0 = Number.parseFloat(((await readout.getByTestId('readout-x').textContent()) ?? '').replace('\u2212', '-'));
	expect(x0).toBeGreaterThan(10);

	// keyboard: the focused chart steps one sample to the right
	const slider = page.getByRole('slider', { name: 'Toe read-out position' });
	await slider.focus();
	await page.keyboard.press('ArrowRight');
	await expect(readout.getByTestId('readout-x')).toHaveText(`${x0 + 1} mm`);
	await page.keyboard.press('ArrowLeft');
	await page.keyboard.press('ArrowLeft');
	await expect(readout.getByTestId('readout-x')).toHaveText(`${x0 - 1} mm`);
	// moving the crosshair does not touch the plotted paths
	const pathChanges = await toe.evaluate(async (svg) => {
		let n = 0;
		const seen = new MutationObserver((records) => (n += records.filter((r) => (r.target as Element).tagName === 'path').length));
		seen.observe(svg, { subtree: true, attributes: true });
		const target = svg.querySelector('.cursor-crosshair')!;
		const r = target.getBoundingClientRect();
		for (let i = 0; i < 40; i++) {
			target.dispatchEvent(new PointerEvent('pointermove', { bubbles: true, clientX: r.left + (r.width * i) / 40, clientY: r.top + r.height / 2 }));
			await new Promise((done) => requestAnimationFrame(done));
		}
		seen.disconnect();
		return n;
	});
	expect(pathChanges).toBe(0);
	await page.mouse.move(box.x + box.width * 0.75, box.y + box.height * 0.4);
	await page.screenshot({ path: 'test-results/screens/charts.png', fullPage: true });

	// exports
	const exports = page.getByRole('group', { name: 'Export Toe' });
	const csv = await download(page, exports.getByRole('button', { name: 'CSV' }));
	expect(csv.name).toBe('toe.csv');
	const lines = csv.bytes.toString('utf8').split('\r\n');
	expect(lines[0]).toBe('"Wheel travel, + bump (mm)",Stock: Toe (deg),Rack lowered 20 mm: Toe (deg)');
	expect(lines[1].split(',')[0]).toBe('-50');
	expect(lines.filter((l) => l !== '').length).toBe(102);

	const svg = await download(page, exports.getByRole('button', { name: 'SVG' }));
	expect(svg.name).toBe('toe.svg');
	const svgText = svg.bytes.toString('utf8');
	expect(svgText.startsWith('<svg')).toBe(true);
	expect(svgText).toContain('data-series="rack-moved"');
	expect(svgText).toContain('Toe (°)');
	expect(svgText).not.toContain('var(--');
	writeFileSync('test-results/screens/charts-export.svg', svgText);

	const png = await download(page, exports.getByRole('button', { name: 'PNG' }));
	expect(png.name).toBe('toe.png');
	expect(png.bytes.subarray(1, 4).toString('ascii')).toBe('PNG');
	expect(png.bytes.length).toBeGreaterThan(5000);
	writeFileSync('test-results/screens/charts-export.png', png.bytes);

	// an empty series says so instead of drawing
	await expect(page.getByTestId('chart-empty-example-empty')).toHaveText('No data');

	await page.evaluate(() => document.documentElement.classList.add('dark'));
	await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.5, { steps: 4 });
	await expect(readout).toContainText('At');
	await page.screenshot({ path: 'test-results/screens/charts-dark.png', fullPage: true });
	expect(problems).toEqual([]);
});
