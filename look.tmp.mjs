import { chromium } from '@playwright/test';
const base = 'http://127.0.0.1:3300';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
const page = await ctx.newPage();
const errors = [];
page.on('console', (m) => { if (m.type() === 'error') errors.push(page.url() + ' ' + m.text()); });
page.on('pageerror', (e) => errors.push(page.url() + ' ' + String(e)));
const shot = (n) => page.screenshot({ path: `/tmp/look/${n}.png`, fullPage: true });
await page.goto(base + '/signin');
await page.getByLabel('E-mail').fill('engineer@linkwright.test');
await page.getByLabel('Password').fill('linkwright-demo');
await page.getByRole('button', { name: 'Sign in' }).click();
await page.waitForURL(base + '/'); await page.waitForLoadState('networkidle');
await shot('1-cars');
// import the CSV fixture onto the hillclimb front left
await page.goto(base + '/corners/00000000-0000-4000-8000-0000000000f1/import'); await page.waitForLoadState('networkidle');
await page.getByLabel('CSV file (at most 5 MB)').setInputFiles('fixtures/club-fwd-front-left-scan-inches.csv');
await page.getByLabel('Units in the file').selectOption('in');
await page.getByRole('button', { name: 'Preview' }).click();
await page.getByTestId('alignment').waitFor();
await shot('2-import-preview');
await page.getByLabel('Label').fill('scan import');
await page.getByRole('button', { name: 'Save as new revision' }).click();
await page.waitForURL(/corners\/[^/]+$/); await page.waitForLoadState('networkidle');
// sweep: roll
await page.getByTestId('sweep-kind').selectOption('roll');
await page.waitForTimeout(3000);
await shot('3-roll-sweep');
// compare
await page.getByRole('link', { name: 'Compare revisions' }).click(); await page.waitForLoadState('networkidle');
await page.getByTestId('pick-b').selectOption({ label: 'r2 rack moved' });
await page.waitForTimeout(3000);
await shot('4-compare');
// share link of the pushrod revision
await page.goto(base + '/corners/00000000-0000-4000-8000-0000000002f1'); await page.waitForLoadState('networkidle');
await page.locator('[data-revision="1"]').getByRole('link', { name: /r1/ }).click(); await page.waitForLoadState('networkidle');
await shot('5-revision');
const before = await page.content();
await page.getByRole('button', { name: /Create link|Create share link|Make link/ }).first().click();
await page.waitForTimeout(2000);
await shot('6-share-created');
const url = await page.evaluate(() => [...document.querySelectorAll('input')].map((i) => i.value).find((v) => v.includes('/s/')) ?? null);
console.log('share url', url);
if (url) {
  const anon = await browser.newPage({ viewport: { width: 1440, height: 900 } });
  anon.on('pageerror', (e) => errors.push('sheet ' + String(e)));
  await anon.goto(url.trim()); await anon.waitForLoadState('networkidle'); await anon.waitForTimeout(3000);
  await anon.screenshot({ path: '/tmp/look/7-sheet.png', fullPage: true });
}
console.log('errors', errors);
await browser.close();
