// The Content-Security-Policy in a real browser: every kind of page, the 3-D view (three.js, WebGL) and the charts
// included, loads and hydrates with no CSP violation (W3C CSP Level 3: violations raise `securitypolicyviolation`
// and a console error), and the page cannot be framed (frame-ancestors 'none').
import { expect, test, type Page } from '@playwright/test';
import { signIn } from './helpers';

const FRONT_LEFT = '/corners/00000000-0000-4000-8000-0000000000f1';
const DEMO_CAR = '/cars/00000000-0000-4000-8000-00000000ca01';

/** Collects CSP violations (events and console messages) and page errors. */
async function watch(page: Page) {
	const problems: string[] = [];
	page.on('console', (m) => {
		if (m.type() === 'error' && /Content Security Policy|Refused to/i.test(m.text())) problems.push(m.text());
	});
	page.on('pageerror', (e) => problems.push(e.message));
	await page.addInitScript(() => {
		document.addEventListener('securitypolicyviolation', (e) => console.error(`Content Security Policy violation: ${e.violatedDirective} ${e.blockedURI} at ${e.sourceFile}:${e.lineNumber}:${e.columnNumber}`));
	});
	return problems;
}

test('pages, the 3-D view and the charts run under the CSP with no violation', async ({ page }) => {
	test.setTimeout(150_000);
	const problems = await watch(page);
	await signIn(page, 'engineer@linkwright.test');
	const csp = (await page.request.get('/')).headers()['content-security-policy'];
	expect(csp).toContain("frame-ancestors 'none'");
	expect(csp).not.toContain('unsafe-eval');
	expect(csp).toMatch(/script-src 'self'( 'sha256-[^']+')+;/);

	await page.goto(FRONT_LEFT);
	const canvas = page.getByTestId('linkage-canvas');
	await expect(canvas).toBeVisible();
	// The canvas counts drawn frames: WebGL ran under the policy.
	await expect.poll(async () => Number(await canvas.getAttribute('data-draws')), { timeout: 30_000 }).toBeGreaterThan(0);
	for (const path of ['/', DEMO_CAR, `${FRONT_LEFT}/compare`, `${FRONT_LEFT}/fix`, `${FRONT_LEFT}/tolerance`, '/account', '/docs/api', '/dev/charts', '/dev/linkage']) {
		const res = await page.goto(path);
		expect(res?.status(), path).toBe(200);
		await page.waitForLoadState('networkidle');
	}
	// The theme script of app.html runs (its hash is in the policy): the toggle's class is applied before paint.
	expect(await page.evaluate(() => typeof document.documentElement.classList.contains('dark'))).toBe('boolean');
	expect(problems).toEqual([]);
});

test('the share sheet, signed out, runs under the CSP and sends no referrer', async ({ page, browser }) => {
	test.setTimeout(120_000);
	await signIn(page, 'engineer@linkwright.test');
	const revisions = await (await page.request.get('/api/v1/corners/00000000-0000-4000-8000-0000000000f1/revisions')).json();
	const share = await (await page.request.post(`/api/v1/revisions/${revisions.revisions[0].id}/shares`, { data: { note: 'CSP check' } })).json();
	const reader = await browser.newPage();
	const problems = await watch(reader);
	const res = await reader.goto(new URL(share.url).pathname);
	expect(res?.status()).toBe(200);
	expect(res?.headers()['referrer-policy']).toBe('no-referrer');
	await expect(reader.getByTestId('linkage-canvas')).toBeVisible();
	await expect.poll(async () => Number(await reader.getByTestId('linkage-canvas').getAttribute('data-draws')), { timeout: 30_000 }).toBeGreaterThan(0);
	expect(problems).toEqual([]);
	await reader.close();
});

test('another site cannot frame a page', async ({ page }) => {
	// A page of another origin (about:blank with srcdoc counts as opaque) framing the sign-in page is blocked.
	const blocked: string[] = [];
	page.on('console', (m) => blocked.push(m.text()));
	await page.setContent(`<iframe id="f" src="${test.info().project.use.baseURL}/signin"></iframe>`);
	await expect.poll(() => blocked.join('\n'), { timeout: 10_000 }).toMatch(/frame-ancestors|Refused to display/i);
});
