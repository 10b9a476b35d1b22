/**
 * Photo time and place in the real web export, at phone size: the inspector ticks "Keep where photos are
 * taken" (the browser is asked for location then), picks a photo whose EXIF (written by piexifjs:
 * DateTimeOriginal 0x9003, GPS 0x0001–0x0004) says when and where, and one without EXIF; the photos step
 * shows each one's time and place with its source. The geolocation is Playwright's stand-in position.
 */
import { readFileSync, writeFileSync } from 'node:fs';

import piexif from 'piexifjs';

import {
  jpegPhoto,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();
const look = { background: '#5d6b4a', fontPx: 40 };

/** The file with an EXIF block inserted by piexifjs: taken 2026-11-20 10:15:30 at +00:00, 48.8584° N 2.2945° E. */
function withCameraExif(file: string): string {
  const exif = piexif.dump({
    Exif: { [piexif.ExifIFD.DateTimeOriginal]: '2026:11:20 10:15:30' },
    GPS: {
      [piexif.GPSIFD.GPSLatitudeRef]: 'N',
      [piexif.GPSIFD.GPSLatitude]: [
        [48, 1],
        [51, 1],
        [3024, 100],
      ],
      [piexif.GPSIFD.GPSLongitudeRef]: 'E',
      [piexif.GPSIFD.GPSLongitude]: [
        [2, 1],
        [17, 1],
        [4020, 100],
      ],
    },
  });
  const out = file.replace(/\.jpg$/, '-exif.jpg');
  writeFileSync(out, Buffer.from(piexif.insert(exif, readFileSync(file).toString('binary')), 'binary'));
  return out;
}

test('with the box ticked, a photo keeps its EXIF time and place, another the device location', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByLabel('Ride Little Kite').waitFor({ timeout: 30000 });
  await page.context().grantPermissions(['geolocation']);
  await page.context().setGeolocation({ latitude: -33.8568, longitude: 151.2153, accuracy: 15 });
  await startPeriodicInspection(page, 'Little Kite');
  await page.getByRole('radio', { name: 'Photos' }).click();

  const box = page.getByRole('checkbox', { name: 'Keep where photos are taken' });
  expect(await box.getAttribute('aria-checked')).toBe('false');
  await box.click();
  await page
    .getByText("Each new photo keeps the camera's GPS position, else this device's location.")
    .waitFor();

  const pick = async (file: string) => {
    const chooser = page.waitForEvent('filechooser');
    await page.getByRole('button', { name: 'Choose from library' }).click();
    await (await chooser).setFiles(file);
  };
  const plain = await jpegPhoto(app.browser, 'Lug, outer face', look);
  await pick(withCameraExif(plain));
  // The time is the camera's, on the device's clock (the browser runs in UTC here); the place its GPS.
  await page
    .getByText(/^Taken 20 Nov 2026, \d\d:15 \(camera clock\) · 48\.8584° N, 2\.2945° E \(camera\)$/)
    .waitFor();
  await pick(plain);
  await page.getByText(/\(device clock\) · 33\.8568° S, 151\.2153° E \(device, ±15 m\)$/).waitFor();
  expect(await page.getByRole('alert').count()).toBe(0);
  await screenshot(page, 'phone-photo-time-place');
});
