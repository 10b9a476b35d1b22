/**
 * Renders the Pivotwatch mark (lib/logo-mark.ts) to the PNG icons the app ships.
 * Run by hand after changing the mark: `npx tsx scripts/render-icons.ts`. Uses Debian's chromium.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { chromium } from 'playwright-core';

import { logoMarkSvg } from '@/lib/logo-mark';
import { launchOptions } from '@/scripts/browser';

// assets/ feeds app.json (app icon, favicon.ico); public/ is copied as-is into the web export.
const targets: { file: string; size: number; rounded: boolean }[] = [
  { file: 'assets/icon.png', size: 1024, rounded: false },
  { file: 'assets/favicon.png', size: 64, rounded: true },
  { file: 'public/icon-192.png', size: 192, rounded: false },
  { file: 'public/icon-512.png', size: 512, rounded: false },
];

async function main() {
  const browser = await chromium.launch(launchOptions());
  try {
    for (const t of targets) {
      const page = await browser.newPage({ viewport: { width: t.size, height: t.size } });
      await page.setContent(
        `<html><body style="margin:0;background:transparent">${logoMarkSvg(t.size, { rounded: t.rounded })}</body></html>`,
      );
      const png = await page.screenshot({
        omitBackground: true,
        clip: { x: 0, y: 0, width: t.size, height: t.size },
      });
      writeFileSync(join(__dirname, '..', t.file), png);
      await page.close();
    }
  } finally {
    await browser.close();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
