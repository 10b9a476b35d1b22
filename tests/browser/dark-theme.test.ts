/**
 * The dark theme in the real export: the page follows the browser's `prefers-color-scheme` (Chromium's
 * media emulation, as an axe run or a person's system setting would set it), and the Account screen's
 * Colour theme card overrides it and keeps the choice over a reload. Expected colours are the palettes of
 * lib/colors.ts, whose contrast is checked against WCAG 2.x in tests/app/theme.test.ts.
 */
import type { Locator, Page } from 'playwright-core';

import { colors, darkColors } from '@/lib/colors';
import { screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();

/** `#RRGGBB` as getComputedStyle writes it. */
const rgb = (hex: string) => {
  const n = parseInt(hex.slice(1), 16);
  return `rgb(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255})`;
};

/** The painted background behind an element: its own, else the nearest ancestor's that is not transparent. */
const backgroundOf = (target: Locator) =>
  target.evaluate((el) => {
    for (let at: Element | null = el; at; at = at.parentElement) {
      const bg = getComputedStyle(at).backgroundColor;
      if (bg !== 'rgba(0, 0, 0, 0)' && bg !== 'transparent') return bg;
    }
    return getComputedStyle(document.body).backgroundColor;
  });

const pageBackground = (page: Page) => page.evaluate(() => getComputedStyle(document.body).backgroundColor);

test('the sign-in page follows the system scheme, both ways, without a reload', async () => {
  const page = await app.openPage('phone');
  await page.emulateMedia({ colorScheme: 'dark' });
  await page.goto(`${app.baseUrl}/sign-in`);
  const email = page.getByLabel('E-mail');
  await email.waitFor();
  expect(await pageBackground(page)).toBe(rgb(darkColors.bg));
  const darkCard = await backgroundOf(page.getByText('Sign in', { exact: true }).first());
  expect(darkCard).toBe(rgb(darkColors.surface));
  await screenshot(page, 'dark-theme-sign-in-phone');

  await page.emulateMedia({ colorScheme: 'light' });
  expect(await pageBackground(page)).toBe(rgb(colors.bg));
  expect(await backgroundOf(page.getByText('Sign in', { exact: true }).first())).toBe(rgb(colors.surface));
  await page.context().close();
});

test('on Account the manual choice overrides the system and survives a reload', async () => {
  const page = await app.openPage('desktop');
  await page.emulateMedia({ colorScheme: 'dark' });
  await page.goto(`${app.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill('supervisor@pivotwatch.test');
  await page.getByLabel('Password').fill('pivotwatch-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  await page.goto(`${app.baseUrl}/account`);
  const card = page.getByTestId('theme-card');
  const choice = (name: string) => card.getByRole('radio', { name });
  await card.waitFor();

  // Following the system (dark): the card and the page are dark, and "System" is the one chosen.
  expect(await choice('System').getAttribute('aria-checked')).toBe('true');
  expect(await backgroundOf(card)).toBe(rgb(darkColors.surface));
  expect(await pageBackground(page)).toBe(rgb(darkColors.bg));
  await screenshot(page, 'dark-theme-account-desktop');

  // Light while the system stays dark, at once and after a reload.
  await choice('Light').click();
  expect(await backgroundOf(card)).toBe(rgb(colors.surface));
  await page.reload();
  await card.waitFor();
  expect(await choice('Light').getAttribute('aria-checked')).toBe('true');
  expect(await backgroundOf(card)).toBe(rgb(colors.surface));
  expect(await pageBackground(page)).toBe(rgb(colors.bg));

  // Dark while the system is light, kept over a reload.
  await page.emulateMedia({ colorScheme: 'light' });
  await choice('Dark').click();
  expect(await backgroundOf(card)).toBe(rgb(darkColors.surface));
  await page.reload();
  await card.waitFor();
  expect(await backgroundOf(card)).toBe(rgb(darkColors.surface));
  expect(await page.evaluate(() => document.documentElement.getAttribute('data-theme'))).toBe('dark');

  // Back to the system: light now, and dark again when the system turns dark.
  await choice('System').click();
  expect(await backgroundOf(card)).toBe(rgb(colors.surface));
  await page.emulateMedia({ colorScheme: 'dark' });
  expect(await backgroundOf(card)).toBe(rgb(darkColors.surface));
  await page.reload();
  await card.waitFor();
  expect(await page.evaluate(() => document.documentElement.hasAttribute('data-theme'))).toBe(false);
  expect(await backgroundOf(card)).toBe(rgb(darkColors.surface));
  await page.context().close();
});
