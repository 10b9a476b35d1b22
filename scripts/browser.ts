import type { LaunchOptions } from 'playwright-core';

/**
 * Debian's chromium, started the way this closed network needs (no background calls home).
 * playwright's `launch` gives every run a fresh temporary profile of its own.
 */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** `extraArgs`: more switches for one test's browser (e.g. Chromium's fake camera playing a file). */
export function launchOptions(extraArgs: string[] = []): LaunchOptions {
  return {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      ...extraArgs,
    ],
  };
}
