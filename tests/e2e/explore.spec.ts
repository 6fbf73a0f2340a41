import { spawn, type ChildProcess } from 'node:child_process';
import { expect, test } from '@playwright/test';
import { databaseUrl, testDatabase } from '../../scripts/db.mjs';
import { signIn } from './helpers';

const FRONT_LEFT = '/corners/00000000-0000-4000-8000-0000000000f1';

// The corner page (3-D view, first solve) is slow to open on a busy two-core machine.
test.describe.configure({ timeout: 120_000 });

// The app queues the chunks; this test runs its own queue worker against the test database (npm test starts none).
let worker: ChildProcess | null = null;
test.beforeAll(() => {
	worker = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], { env: { ...process.env, DATABASE_URL: process.env.TEST_DATABASE_URL ?? (databaseUrl(testDatabase) as string), LW_WORKER_THREADS: '1' }, stdio: 'ignore' });
});
test.afterAll(async () => {
	if (!worker || worker.exitCode !== null) return;
	const exited = new Promise((r) => worker!.once('exit', r));
	worker.kill('SIGTERM');
	await exited;
});

test('design-space exploration: the engineer explores the rack-moved corner over the tie-rod joints, picks a Pareto point and saves it', async ({ page }) => {
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(FRONT_LEFT);
	await page.locator('[data-revision="2"]').getByRole('link', { name: 'Start from this' }).click();
	await expect(page.getByText(/Showing r2 “rack moved”/)).toBeVisible({ timeout: 20_000 });
	await page.getByRole('link', { name: 'Explore design space' }).click();
	await expect(page.getByRole('heading', { name: 'Design-space exploration' })).toBeVisible({ timeout: 20_000 });
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('caution')).toBeVisible();
	await expect(page.getByLabel('Revision to explore').locator('option:checked')).toHaveText('r2 rack moved');

	// The tie-rod joints' heights (the rack went 20 mm up): inner −25…+5 mm, outer −15…+15 mm, picked by default.
	await expect(page.getByLabel('Explore steer.inner z')).toBeChecked();
	await expect(page.getByLabel('Explore steer.outer z')).toBeChecked();
	await page.getByLabel('Variants').fill('1000');
	// Keep four of the measures (motion ratio left out): only those are solved, stored, plotted and tabled.
	await page.getByLabel('Keep motion ratio').uncheck();
	await page.getByRole('button', { name: 'Explore' }).click();
	await expect(page.getByTestId('explore-state')).toHaveText('done', { timeout: 60_000 });

	// The scatter-plot matrix of the four kept measures: 4 × 3 / 2 pair cells and a label per measure.
	await expect(page.getByTestId('scatter-matrix')).toBeVisible();
	await expect(page.getByTestId('matrix-cell')).toHaveCount(6);
	await expect(page.getByTestId('matrix-label')).toHaveCount(4);
	await expect(page.getByRole('table', { name: 'Variants' }).locator('th')).toHaveText(['Variant', 'Moves (mm)', 'Toe RMS (°)', 'Camber gain (°/mm)', 'RC height (mm)', 'RC migration (mm)']);

	// A third objective: the front of three, coloured by it.
	await page.getByLabel('Objective z (optional)').selectOption('rc_height');
	await expect(page.getByTestId('pareto-z-legend')).toBeVisible();
	const points = page.getByTestId('pareto-point');
	await expect(points.first()).toHaveAttribute('data-z', /\d/);
	// back to two objectives for the pick
	await page.getByLabel('Objective z (optional)').selectOption('');
	await expect(page.getByTestId('pareto-z-legend')).toHaveCount(0);
	await expect(points.first()).toBeVisible();
	expect(await points.count()).toBeGreaterThan(1);
	// The front's points lie close together: pick the least toe change (the first) from the keyboard.
	await points.first().focus();
	await page.keyboard.press('Enter');
	await expect(page.getByTestId('explore-selected')).toContainText(/steer\.inner z [+-]?\d+\.\d\d mm/);
	await page.getByRole('button', { name: 'Save as a revision' }).click();
	await expect(page.getByRole('status')).toContainText(/Saved as r\d+/);
});
