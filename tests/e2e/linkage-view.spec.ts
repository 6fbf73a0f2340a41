// The 3-D linkage view on its dev page: renders real pixels (WebGL through SwiftShader here), follows the
// travel slider and the preset views, and logs no console errors.
import { expect, test, type Page } from '@playwright/test';
import { mkdirSync } from 'node:fs';

/** Statistics of the canvas pixels, read by drawing the WebGL canvas (preserveDrawingBuffer) into a 2-D canvas. */
async function canvasStats(page: Page) {
	return page.getByTestId('linkage-canvas').evaluate((el) => {
		const src = el as HTMLCanvasElement;
		const copy = document.createElement('canvas');
		copy.width = src.width;
		copy.height = src.height;
		const ctx = copy.getContext('2d')!;
		ctx.drawImage(src, 0, 0);
		const { data } = ctx.getImageData(0, 0, copy.width, copy.height);
		const colours = new Set<number>();
		let sum = 0;
		let sumSq = 0;
		let n = 0;
		let hash = 2166136261;
		for (let i = 0; i < data.length; i += 4 * 7) {
			hash = Math.imul(hash ^ ((data[i] << 16) | (data[i + 1] << 8) | data[i + 2]), 16777619) >>> 0;
			const lum = 0.2126 * data[i] + 0.7152 * data[i + 1] + 0.0722 * data[i + 2];
			colours.add((data[i] << 16) | (data[i + 1] << 8) | data[i + 2]);
			sum += lum;
			sumSq += lum * lum;
			n++;
		}
		const mean = sum / n;
		return { width: copy.width, height: copy.height, colours: colours.size, variance: sumSq / n - mean * mean, hash };
	});
}

test('the 3-D linkage view renders, follows the travel slider and the preset views', async ({ page }) => {
	test.setTimeout(90_000); // a long journey; software WebGL on a busy 2-core machine
	const problems: string[] = [];
	page.on('console', (m) => {
		if (m.type() === 'error') problems.push(m.text());
	});
	page.on('pageerror', (e) => problems.push(e.message));

	await page.setViewportSize({ width: 1440, height: 900 });
	await page.goto('/dev/linkage');
	const canvas = page.getByTestId('linkage-canvas');
	await expect(canvas).toBeVisible({ timeout: 30_000 }); // three.js and a software WebGL context start slowly on a busy machine
	await expect(canvas).toHaveAttribute('aria-label', /3-D view of the double wishbone linkage/);
	await expect(page.getByRole('button', { name: 'Front view, looking rearward' })).toBeEnabled();

	// not one flat colour: the linkage, tyre, grid and labels are drawn
	await expect.poll(async () => (await canvasStats(page)).colours).toBeGreaterThan(20);
	const first = await canvasStats(page);
	expect(first.width).toBeGreaterThan(300);
	expect(first.variance).toBeGreaterThan(5);

	// the slider moves the linkage and the label follows (the page starts at frame 10 = 0.0 mm)
	const position = page.getByTestId('linkage-position');
	await expect(position).toHaveText(/Travel 0\.0 mm/);
	const slider = page.getByRole('slider', { name: 'Travel position' });
	await slider.focus();
	for (let i = 0; i < 8; i++) await page.keyboard.press('ArrowRight');
	await expect(position).toHaveText(/Travel \+40\.0 mm/);
	await expect.poll(async () => (await canvasStats(page)).hash).not.toBe(first.hash);
	await slider.fill('0');
	await expect(position).toHaveText(/Travel −50\.0 mm/);

	// focusing a point row highlights it; the preset views change the picture
	mkdirSync('test-results/screens', { recursive: true });
	await page.getByRole('row', { name: /upper\.outer/ }).focus();
	for (const name of ['Front view, looking rearward', 'Side view, from outboard', 'Top view, forward up', 'Three-quarter 3-D view']) {
		const before = (await canvasStats(page)).hash;
		await page.getByRole('button', { name }).click();
		await expect(page.getByRole('button', { name })).toHaveAttribute('aria-pressed', 'true');
		await expect.poll(async () => (await canvasStats(page)).hash).not.toBe(before);
		await canvas.screenshot({ path: `test-results/screens/linkage-view-${name.split(' ')[0].toLowerCase()}.png` });
	}

	// the canvas takes the keyboard: Shift + arrow orbits
	const beforeKeys = (await canvasStats(page)).hash;
	await canvas.focus();
	for (let i = 0; i < 4; i++) await page.keyboard.press('Shift+ArrowLeft');
	await expect.poll(async () => (await canvasStats(page)).hash).not.toBe(beforeKeys);

	// play runs through the travel and pauses again
	await page.getByRole('button', { name: 'Play through the travel' }).click();
	await expect(position).not.toHaveText(/Travel −50\.0 mm/);
	await page.getByRole('button', { name: 'Pause the travel animation' }).click();
	await expect(page.getByRole('button', { name: 'Play through the travel' })).toBeVisible();

	await slider.fill('16');
	await page.getByRole('button', { name: 'Three-quarter 3-D view' }).click();
	await page.getByRole('row', { name: /steer\.outer/ }).focus();
	mkdirSync('test-results/screens', { recursive: true });
	await page.screenshot({ path: 'test-results/screens/linkage-view.png', fullPage: true });
	await page.getByRole('button', { name: 'Front view, looking rearward' }).click();
	await page.screenshot({ path: 'test-results/screens/linkage-view-front.png', fullPage: true });
	// dark theme: the view re-reads the theme colours
	await page.evaluate(() => document.documentElement.classList.add('dark'));
	await page.getByRole('button', { name: 'Three-quarter 3-D view' }).click();
	await page.screenshot({ path: 'test-results/screens/linkage-view-dark.png', fullPage: true });

	// new data in the same view (client-side navigation to another corner): redrawn, not remounted
	const darkHash = (await canvasStats(page)).hash;
	await page.getByRole('link', { name: 'Road strut front left' }).click();
	await expect(canvas).toHaveAttribute('aria-label', /strut linkage/);
	await expect.poll(async () => (await canvasStats(page)).hash).not.toBe(darkHash);

	expect(problems).toEqual([]);
});

test('the strut corner draws too', async ({ page }) => {
	const problems: string[] = [];
	page.on('console', (m) => {
		if (m.type() === 'error') problems.push(m.text());
	});
	page.on('pageerror', (e) => problems.push(e.message));
	await page.setViewportSize({ width: 1440, height: 900 });
	await page.goto('/dev/linkage?corner=strut');
	await expect(page.getByTestId('linkage-canvas')).toHaveAttribute('aria-label', /strut linkage/);
	await expect.poll(async () => (await canvasStats(page)).colours).toBeGreaterThan(20);
	mkdirSync('test-results/screens', { recursive: true });
	await page.screenshot({ path: 'test-results/screens/linkage-view-strut.png', fullPage: true });
	expect(problems).toEqual([]);
});

test('without WebGL the view says so instead of failing', async ({ page }) => {
	const problems: string[] = [];
	page.on('pageerror', (e) => problems.push(e.message));
	await page.addInitScript(() => {
		const original = HTMLCanvasElement.prototype.getContext;
		HTMLCanvasElement.prototype.getContext = function (this: HTMLCanvasElement, id: string, ...rest: unknown[]) {
			if (id === 'webgl2' || id === 'webgl') return null;
			return (original as (...a: unknown[]) => RenderingContext | null).call(this, id, ...rest);
		} as typeof original;
	});
	await page.goto('/dev/linkage');
	await expect(page.getByRole('status').filter({ hasText: 'needs WebGL 2' })).toBeVisible({ timeout: 15_000 });
	await expect(page.getByRole('button', { name: 'Front view, looking rearward' })).toBeDisabled();
	expect(problems).toEqual([]);
});

test('no two labels overlap in any preset view, and the labels in view stay inside it', async ({ page }) => {
	// A 390 px wide view brings the roll centre, the instant centre, the centreline and the axes triad close together.
	await page.setViewportSize({ width: 390, height: 844 });
	await page.goto('/dev/linkage');
	const canvas = page.getByTestId('linkage-canvas');
	await expect(page.getByRole('button', { name: 'Front view, looking rearward' })).toBeEnabled();
	type Placed = [string, number, number, number, number];
	for (const name of ['Front view, looking rearward', 'Side view, from outboard', 'Top view, forward up', 'Three-quarter 3-D view']) {
		const before = await canvas.getAttribute('data-draws');
		await page.getByRole('button', { name }).click();
		await expect.poll(() => canvas.getAttribute('data-draws')).not.toBe(before);
		await page.waitForTimeout(400); // the preset's last frame
		const box = (await canvas.boundingBox())!;
		const labels = JSON.parse((await canvas.getAttribute('data-labels')) ?? '[]') as Placed[];
		expect(labels.length, name).toBeGreaterThan(0);
		// only the labels whose anchor is in view can be kept apart; an instant centre far outside the picture is not drawn on it
		const shown = labels.filter(([, x, y, w, h]) => x + w > 0 && x < box.width && y + h > 0 && y < box.height);
		for (let i = 0; i < shown.length; i++)
			for (let j = i + 1; j < shown.length; j++) {
				const [a, ax, ay, aw, ah] = shown[i];
				const [b, bx, by, bw, bh] = shown[j];
				// axis-aligned boxes are apart when they are apart on one axis (separating axis theorem)
				const apart = ax + aw <= bx || bx + bw <= ax || ay + ah <= by || by + bh <= ay;
				expect(apart, `${name}: ${a} and ${b} overlap`).toBe(true);
			}
		await page.screenshot({ path: `test-results/screens/linkage-labels-${name.split(' ')[0].toLowerCase()}-390.png` });
	}
});
