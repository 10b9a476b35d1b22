/**
 * Plate codes: the address a plate holds is written by one module (features/rides/plate-url.ts) and read
 * back by the same module, and the code survives the trip through a picture: encoded by the `qrcode` npm
 * package and decoded by another implementation, jsQR (the `jsqr` npm package), both per ISO/IEC 18004.
 * The label sheet's own matrix (server/reports/plate-sheet-pdf.ts) is checked the same way.
 */
import jsQR from 'jsqr';

import { parsePlateCode, parsePlatePath, platePath, plateUrl } from '@/features/rides/plate-url';
import { plateModules } from '@/server/reports/plate-sheet-pdf';
import { qrPicture, toRgba } from '@/tests/support/qr-picture';

const APP = 'https://pivotwatch.example.net';

describe('codes decode back to the exact address (qrcode → jsQR)', () => {
  const urls = [
    plateUrl(APP, { rideId: 'ride-twin-comet', joint: null }),
    plateUrl(APP, { rideId: 'ride-twin-comet', joint: 0 }),
    plateUrl(APP, { rideId: '3f2b8c1e-9a47-4d2e-b0c5-7e6a1f92d4b3', joint: 11 }),
    plateUrl(`${APP}/`, { rideId: 'ride.2_b~c', joint: 2 }),
  ];
  test.each(urls)('QRCode.create(%s)', (url) => {
    const pic = qrPicture(url, { scale: 4 });
    const code = jsQR(toRgba(pic), pic.width, pic.height);
    expect(code?.data).toBe(url);
    expect(parsePlateCode(code!.data, APP).ok).toBe(true);
  });
  test.each(urls)("the label sheet's matrix for %s", (url) => {
    const m = plateModules(url);
    const scale = 4;
    const side = (m.size + 8) * scale;
    const rgba = new Uint8ClampedArray(side * side * 4).fill(255);
    for (let y = 0; y < side; y++)
      for (let x = 0; x < side; x++) {
        const row = Math.floor(y / scale) - 4;
        const col = Math.floor(x / scale) - 4;
        if (row >= 0 && col >= 0 && row < m.size && col < m.size && m.dark(row, col))
          rgba.set([0, 0, 0], (y * side + x) * 4);
      }
    expect(jsQR(rgba, side, side)?.data).toBe(url);
  });
});

describe('the plate address', () => {
  test('a pivot is numbered from 1 as the readings step shows it; the ride alone has no number', () => {
    expect(platePath({ rideId: 'r1', joint: null })).toBe('/plate/r1');
    expect(platePath({ rideId: 'r1', joint: 0 })).toBe('/plate/r1/1');
    expect(plateUrl(`${APP}//`, { rideId: 'r:1', joint: 2 })).toBe(`${APP}/plate/r%3A1/3`);
    expect(parsePlatePath('/plate/r%3A1/3')).toEqual({ rideId: 'r:1', joint: 2 });
    // No ride id holds a space or a slash: such a path names no plate.
    expect(parsePlatePath('/plate/a%20b/3')).toBeNull();
    expect(parsePlatePath('/plate/a%2Fb')).toBeNull();
    expect(parsePlatePath('/plate/r1')).toEqual({ rideId: 'r1', joint: null });
  });

  test("accepts only this app's plate addresses", () => {
    const ok = (code: string, base = APP) => parsePlateCode(code, base);
    expect(ok(`${APP}/plate/r1/2`)).toEqual({ ok: true, target: { rideId: 'r1', joint: 1 } });
    expect(ok(`  ${APP}/plate/r1  `)).toEqual({ ok: true, target: { rideId: 'r1', joint: null } });
    // Served below a path: the plate lies under it.
    expect(ok('https://example.net/pw/plate/r1/1', 'https://example.net/pw')).toEqual({
      ok: true,
      target: { rideId: 'r1', joint: 0 },
    });
    expect(ok('')).toEqual({ ok: false, why: 'empty' });
    // Another server's plate is told apart from something that is no plate at all.
    expect(ok('https://other.example.org/plate/r1/2')).toEqual({ ok: false, why: 'other-server' });
    expect(ok('http://pivotwatch.example.net/plate/r1')).toEqual({ ok: false, why: 'other-server' });
    expect(ok('https://pivotwatch.example.net:8443/plate/r1')).toEqual({ ok: false, why: 'other-server' });
    for (const bad of [
      'hello',
      'WIFI:S:park;T:WPA;P:secret;;',
      `${APP}/rides/r1`,
      `${APP}/plate/`,
      `${APP}/plate/r1/0`,
      `${APP}/plate/r1/x`,
      `${APP}/plate/r1/2/3`,
      `${APP}/plate/r1?next=/admin`,
      `${APP}/plate/r1#2`,
      `https://user:pw@pivotwatch.example.net/plate/r1`,
      `javascript:alert(1)//${APP}/plate/r1`,
      `${APP}/plate/${'x'.repeat(65)}`,
      `${APP}/plate/%E0%A4%A`,
    ])
      expect(ok(bad)).toEqual({ ok: false, why: 'not-plate' });
  });
});
