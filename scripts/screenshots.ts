/**
 * Screenshots of every role's pages at phone and desktop size, from a running Pivotwatch
 * (`npm start` first; it listens on loopback and seeds the demo users there).
 * `npx tsx scripts/screenshots.ts [baseUrl] [path ...]` → artifacts/screenshots/.
 * Extra paths are visited after sign-in (e.g. /loads) for each role that can open them.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium } from 'playwright-core';

import { launchOptions } from '@/scripts/browser';

const roles = ['inspector', 'supervisor', 'operator', 'admin'];
const sizes = { phone: { width: 390, height: 844 }, desktop: { width: 1440, height: 900 } };

async function main() {
  const [baseUrl = 'http://127.0.0.1:8080', ...paths] = process.argv.slice(2);
  const out = join(__dirname, '..', 'artifacts', 'screenshots', 'manual');
  mkdirSync(out, { recursive: true });
  const browser = await chromium.launch(launchOptions());
  try {
    for (const role of roles) {
      for (const [sizeName, viewport] of Object.entries(sizes)) {
        const page = await (await browser.newContext({ viewport })).newPage();
        page.on('pageerror', (e) => console.log(`[${role} ${sizeName}] page error: ${e.message}`));
        await page.goto(`${baseUrl}/sign-in`);
        await page.getByLabel('E-mail').fill(`${role}@pivotwatch.test`);
        await page.getByLabel('Password').fill('pivotwatch-demo');
        await page.getByRole('button', { name: 'Sign in' }).click();
        await page.waitForURL((url) => url.pathname !== '/sign-in');
        await page.waitForLoadState('networkidle');
        // The inspector's home opens the on-device database first; give it a moment.
        await page.waitForTimeout(1500);
        const home = new URL(page.url()).pathname.slice(1);
        await page.screenshot({ path: join(out, `${role}-${sizeName}-${home}.png`) });
        for (const path of paths) {
          await page.goto(`${baseUrl}${path}`);
          await page.waitForLoadState('networkidle');
          await page.screenshot({ path: join(out, `${role}-${sizeName}${path.replace(/\//g, '-')}.png`) });
        }
        await page.context().close();
      }
    }
  } finally {
    await browser.close();
  }
  console.log(`screenshots in ${out}`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
