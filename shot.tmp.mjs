import { chromium } from '@playwright/test';
const base = 'http://127.0.0.1:3000';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
const errors = [];
page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
page.on('pageerror', (e) => errors.push(String(e)));
await page.goto(base + '/signin');
await page.getByLabel('E-mail').fill('engineer@linkwright.test');
await page.getByLabel('Password').fill('linkwright-demo');
await page.getByRole('button', { name: 'Sign in' }).click();
await page.waitForURL(base + '/');
for (const [name, id] of process.argv.slice(2).map((a) => a.split('='))) {
  await page.goto(base + '/corners/' + id);
  await page.waitForTimeout(6000);
  await page.screenshot({ path: `/tmp/shots/${name}.png`, fullPage: true });
}
console.log('errors', errors);
await browser.close();
