// Packaging in the fix search (issue 16): the engineer fits a smaller rim on the single-seater's front axle (the car
// model's rim barrel keep-out, 150 → 130 mm), runs the fix search on the front-left corner and reads which volume
// stops every fix.
import { expect, test } from '@playwright/test';
import { settled, signIn } from './helpers';

const SINGLE_SEATER = '00000000-0000-4000-8000-00000000ca02';
const FRONT_LEFT = '00000000-0000-4000-8000-0000000002f1';

test.describe.configure({ timeout: 90_000 });

test('a smaller rim barrel on the car model: the fix search reports that the rim stops every fix', async ({ page }) => {
	const errors: string[] = [];
	page.on('pageerror', (e) => errors.push(e.message));
	await signIn(page, 'engineer@linkwright.test');
	await page.goto(`/cars/${SINGLE_SEATER}/model`);
	await settled(page);
	const editor = page.getByTestId('keep-out-editor');
	await expect(editor.locator('[data-keep-out="Front rim barrel"]')).toBeVisible();
	const radius = page.getByLabel('Front rim barrel barrel inner radius (mm)');
	await radius.fill('130');
	await page.getByLabel('Label').fill('13-inch rim, smaller barrel');
	await page.getByRole('button', { name: /Save as revision c\d+/ }).click();
	await expect(page.getByRole('heading', { name: /Revision c\d+ · 13-inch rim, smaller barrel/ })).toBeVisible();
	await expect(page.getByLabel('Front rim barrel barrel inner radius (mm)')).toHaveValue('130');
	// the revision's changes list names the volume and the field that changed
	await expect(page.getByTestId('car-changes')).toContainText('Keep-out “Front rim barrel” barrel radius');

	await page.goto(`/corners/${FRONT_LEFT}/fix`);
	await expect(page.getByRole('heading', { name: 'Fix search' })).toBeVisible();
	await settled(page);
	const packaging = page.getByTestId('fix-packaging');
	await expect(packaging.getByLabel('Keep out of Front rim barrel')).toBeChecked();
	await expect(packaging).toContainText('r 130 − 8 mm');
	await page.getByLabel('Fit camber').uncheck();
	await page.getByRole('radio', { name: 'no change' }).check();
	await page.getByRole('button', { name: 'Run fix search' }).click();

	const blocked = page.getByTestId('fix-blocked');
	await expect(blocked).toBeVisible({ timeout: 60_000 });
	await expect(blocked).toContainText('Every fix found reaches into “Front rim barrel”');
	await expect(blocked).toContainText('steer.inner–steer.outer');
	await expect(page.getByTestId('fix-volumes').locator('tr[data-volume="Front rim barrel"]')).toHaveAttribute('data-status', 'collides');
	await expect(page.getByRole('button', { name: 'Save as new revision' })).toBeDisabled();
	await page.screenshot({ path: 'test-results/screens/fix-keep-out.png', fullPage: true });
	expect(errors).toEqual([]);
});
