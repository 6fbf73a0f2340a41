// Sharing with the fabricator: the engineer creates and mails a link, the fabricator opens it signed out and
// prints it, the engineer revokes it; a viewer cannot share. Each journey makes its own car and revisions.
import { readFileSync } from 'node:fs';
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { settled, signIn } from './helpers';
import { pdfPages } from './pdf-text';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
// The proposal: the inner tie-rod joint 15 mm back and 20 mm up; nothing else moves.
const moved = structuredClone(stock);
moved.points['steer.inner'] = [-145, 358, 196];

/** A car with a front-left corner, a stock baseline and a moved revision; returns the moved revision's id. */
async function makeRevisions(request: APIRequestContext, name: string) {
	const car = await (await request.post('/api/v1/cars', { data: { name } })).json();
	const corner = await (await request.post(`/api/v1/cars/${car.id}/corners`, { data: { position: 'front_left', kind: 'double_wishbone' } })).json();
	const r1 = await (await request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'stock', note: '', geometry: stock } })).json();
	const r2 = await (await request.post(`/api/v1/corners/${corner.id}/revisions`, { data: { label: 'rack moved', note: 'Rack up and back', geometry: moved } })).json();
	expect((await request.put(`/api/v1/corners/${corner.id}/baseline`, { data: { revisionId: r1.id } })).ok()).toBe(true);
	return { cornerId: corner.id as string, revisionId: r2.id as string };
}

/** Collects console errors of a page. */
function consoleErrors(page: Page) {
	const errors: string[] = [];
	page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
	page.on('pageerror', (e) => errors.push(e.message));
	return errors;
}

test('an engineer mails a link; the fabricator opens it signed out, reads and prints the coordinates; revoked, it is gone', async ({ page, browser }) => {
	test.setTimeout(150_000);
	await signIn(page, 'engineer@linkwright.test');
	const { cornerId, revisionId } = await makeRevisions(page.request, `Shop link car ${Date.now()}`);
	const fabricator = `fabricator-${Date.now()}@example.test`;

	// The corner page's history leads to the revision page, which carries the share panel.
	await page.goto(`/corners/${cornerId}`);
	await page.locator('[data-revision="2"]').getByRole('link', { name: /r2/ }).click();
	await expect(page).toHaveURL(`/revisions/${revisionId}`);
	const panel = page.getByTestId('share-panel');
	await panel.getByLabel('Valid for (days)').fill('14');
	await panel.getByLabel('Mail it to (optional)').fill(fabricator);
	await panel.getByLabel('Note for the fabricator').fill('Weld the new rack brackets to these points');
	await panel.getByRole('button', { name: 'Create link' }).click();
	await expect(page.getByTestId('share-mail-status')).toHaveText(`Mailed to ${fabricator}.`);
	const url = await page.getByTestId('share-url').inputValue();
	expect(url).toMatch(/\/s\/[A-Za-z0-9_-]{43}$/);
	await expect(page.getByTestId('share-list').locator('tbody tr')).toHaveCount(1);
	// the list says whom the link went to, and the form is ready for the next link with the default validity
	await expect(page.getByTestId('share-sent-to')).toHaveText(fabricator);
	await expect(panel.getByLabel('Valid for (days)')).not.toHaveValue('');
	await page.screenshot({ path: 'test-results/screens/share-panel.png', fullPage: true });

	// The mail arrived in the fake SMTP server, and the mailbox page shows its link.
	await page.goto(`/dev/mail?to=${encodeURIComponent(fabricator)}`);
	await page.getByTestId('mail-list').getByRole('link').first().click();
	await expect(page.getByTestId('mail-text')).toContainText(url);
	await expect(page.getByTestId('mail-text')).toContainText('Weld the new rack brackets');
	await page.screenshot({ path: 'test-results/screens/mailbox-message.png', fullPage: true });

	// A fresh browser with no session opens the link and reads the coordinates.
	const guest = await browser.newContext();
	const sheet = await guest.newPage();
	const errors = consoleErrors(sheet);
	await sheet.goto(url);
	await expect(sheet.getByRole('heading', { level: 1 })).toHaveText(/Shop link car/);
	const row = sheet.getByTestId('sheet-table').locator('tr[data-point="steer.inner"]');
	await expect(row.locator('td')).toHaveText(['-145.0', '358.0', '196.0', '-15.0', '0.0', '+20.0']);
	await expect(sheet.getByTestId('sheet-table').locator('tr[data-point="lower.front"] td').first()).toHaveText('180.0');
	await expect(sheet.getByTestId('sheet-moved')).toContainText('1 point moved from the baseline r1');
	await expect(sheet.getByTestId('sheet-facts')).toContainText('ISO 8855');
	await expect(sheet.getByTestId('axis-diagram')).toBeVisible();
	await expect(sheet.getByTestId('caution')).toBeVisible();
	await expect(sheet.getByTestId('share-note')).toContainText('Weld the new rack brackets');
	await expect(sheet.getByTestId('linkage-canvas')).toBeVisible();
	await expect(sheet.getByRole('link', { name: /cars|sign in|account/i })).toHaveCount(0);
	await sheet.screenshot({ path: 'test-results/screens/share-sheet.png', fullPage: true });

	// The CSV through the token.
	const csv = await sheet.request.get(`${url}/csv`);
	expect(await csv.text()).toContain('steer.inner,"Tie rod, inner joint",-145.0,358.0,196.0,-15.0,0.0,20.0');

	// Printed to PDF on A4 and on Letter: the sheet's text holds revision, units, frame, table and deltas.
	await sheet.emulateMedia({ media: 'print' });
	await sheet.screenshot({ path: 'test-results/screens/share-sheet-print.png', fullPage: true });
	for (const format of ['A4', 'Letter'] as const) {
		const pages = await pdfPages(await sheet.pdf({ format, printBackground: true }));
		// PDF.js splits the text into runs at its own places: compare without white space.
		const text = pages.map((p) => p.text).join('').replace(/\s+/g, '');
		// A4 is 210 × 297 mm = 595.3 × 841.9 pt (ISO 216), Letter 8.5 × 11 in = 612 × 792 pt (ANSI/ASME Y14.1);
		// Chromium rounds A4 to 8.27 × 11.7 in, hence the 2 pt allowance.
		const [w, h] = format === 'A4' ? [595.3, 841.9] : [612, 792];
		expect(Math.abs(pages[0].width - w)).toBeLessThan(2);
		expect(Math.abs(pages[0].height - h)).toBeLessThan(2);
		expect(pages.length).toBeLessThanOrEqual(2);
		for (const words of ['r2', 'rack moved', 'millimetres', 'ISO 8855', '-145.0', '358.0', '196.0', '+20.0', '180.0', '1 point moved from the baseline r1', 'Printed']) {
			expect(text, `${format} sheet holds ${words}`).toContain(words.replace(/\s+/g, ''));
		}
		expect(text).not.toContain('Downloadthetable');
	}
	expect(errors).toEqual([]);

	// Revoked from the revision page: the same URL no longer opens.
	await page.goto(`/revisions/${revisionId}`);
	await settled(page);
	// Revoke asks first: dismissed, the link stays; accepted, it goes
	let asked = '';
	page.once('dialog', (d) => ((asked = d.message()), d.dismiss()));
	await page.getByTestId('share-list').getByRole('button', { name: 'Revoke' }).click();
	await expect.poll(() => asked).toContain(`sent to ${fabricator}`);
	await expect(page.getByTestId('share-list').getByRole('button', { name: 'Revoke' })).toBeVisible();
	page.once('dialog', (d) => d.accept());
	await page.getByTestId('share-list').getByRole('button', { name: 'Revoke' }).click();
	await expect(page.getByTestId('share-list')).toContainText('revoked');
	const gone = await sheet.goto(url);
	expect(gone?.status()).toBe(404);
	await expect(sheet.getByTestId('share-error')).toContainText('This link does not work');
	await guest.close();
});

test('a viewer sees no share button and the API refuses with 403', async ({ page, browser }) => {
	const engineer = await browser.newContext();
	const engineerPage = await engineer.newPage();
	await signIn(engineerPage, 'engineer@linkwright.test');
	const { revisionId } = await makeRevisions(engineerPage.request, `Viewer check car ${Date.now()}`);
	await engineer.close();

	await signIn(page, 'viewer@linkwright.test');
	await page.goto(`/revisions/${revisionId}`);
	await expect(page.getByRole('heading', { name: /Revision 2/ })).toBeVisible();
	await expect(page.getByTestId('share-panel')).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Create link' })).toHaveCount(0);
	await expect(page.getByRole('link', { name: 'Share' })).toHaveCount(0);
	const res = await page.request.post(`/api/v1/revisions/${revisionId}/shares`, { data: { expiresInDays: 5 } });
	expect(res.status()).toBe(403);
	expect((await res.json()).error.code).toBe('forbidden');
});

test('the study report of a comparison prints to PDF with the points, what moved, the targets judged, every chart and the caution', async ({ page }) => {
	await signIn(page, 'viewer@linkwright.test');
	await page.goto('/corners/00000000-0000-4000-8000-0000000000f1');
	await page.getByRole('link', { name: 'Study report' }).click();
	const report = page.getByTestId('report');
	await expect(report).toBeVisible();
	// against the baseline r1 by default
	await page.getByLabel('Revision reported').selectOption({ label: 'r2 rack moved' });
	await expect(page.getByText('Set against r1')).toBeVisible();
	// the demo's r2 moved the rack-end joint from (−130, 358, 176) to (−145, 358, 196) (fixtures/demo/front-left-*.json):
	// Δx −15.0, Δz +20.0; nothing else moved
	await expect(page.locator('tr[data-point="steer.inner"] td')).toHaveText(['Tie rod, inner joint steer.inner', '-145.0', '358.0', '196.0', '-15.0', '0.0', '20.0']);
	await expect(page.locator('tr[data-point="lower.front"]')).toContainText('unchanged');
	await expect(page.getByTestId('report-targets')).toContainText('not met');
	await expect(page.getByTestId('report-joints')).toContainText('Upper ball joint');
	// every measure of every sweep: heave, roll and steer
	await expect(page.getByRole('figure', { name: 'Toe' })).toHaveCount(3);
	await page.screenshot({ path: 'test-results/screens/study-report.png', fullPage: true });
	await page.emulateMedia({ media: 'print' });
	const pages = await pdfPages(await page.pdf({ format: 'A4', printBackground: true }));
	const text = pages.map((p) => p.text).join('').replace(/\s+/g, '');
	expect(pages.length).toBeGreaterThanOrEqual(3);
	// A4, 595.3 × 841.9 pt (ISO 216)
	expect(Math.abs(pages[0].width - 595.3)).toBeLessThan(2);
	for (const words of ['study report', 'r2 rack moved', 'Set against r1', 'kinematic estimates', 'qualified fabricators', 'Tie rod, inner joint', 'Targets', 'Joint angles', 'Figures through heave', 'Roll-centre height', 'Camber to ground', 'Rack travel', 'ISO 8855']) {
		expect(text, `the report holds ${words}`).toContain(words.replace(/\s+/g, ''));
	}
	expect(text).not.toContain('PrintorsaveasPDF');
	// the charts' export buttons are for the screen
	expect(text).not.toContain('PNGSVGCSV');
});
