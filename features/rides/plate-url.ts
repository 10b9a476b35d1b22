/**
 * What a ride's plate (the printed QR label) holds: an address of this app, so any phone's camera opens
 * Pivotwatch at that ride, or at one of its pivots. `/plate/<ride id>` names the ride;
 * `/plate/<ride id>/<pivot number>` one pivot, numbered from 1 along the body chain as the readings step
 * shows it ("Pivot 2" is joint 1). The server prints them (server/reports/plate-sheet.ts) and the scanner
 * reads them back (features/inspections/scan-screen.tsx), both through this one module.
 */
import { appLink } from '@/lib/paths';

/** What a plate names: a ride, and a pivot of it by its joint index (0-based), or the whole ride. */
export type PlateTarget = { rideId: string; joint: number | null };

export const PLATE_PATH = '/plate' as const;

const MAX_ID = 64;
const MAX_PIVOT = 99;

const trimBase = (base: string) => base.replace(/\/+$/, '');

/** The plate's path inside the app (also its route under app/(app)/plate). */
export function platePath(target: PlateTarget): `/${string}` {
  const ride = `${PLATE_PATH}/${encodeURIComponent(target.rideId)}` as const;
  return target.joint === null ? ride : `${ride}/${target.joint + 1}`;
}

/** The full address a plate's code holds: the app's public address (APP_URL), as e-mailed links use it. */
export function plateUrl(appUrl: string, target: PlateTarget): string {
  return appLink(appUrl, platePath(target));
}

/** Why a scanned or typed code was refused, in words an inspector can act on. */
export type PlateRefusal = 'empty' | 'not-plate' | 'other-server';

export type PlateParse = { ok: true; target: PlateTarget } | { ok: false; why: PlateRefusal };

/**
 * Reads a plate's path (`/plate/<ride>` or `/plate/<ride>/<pivot number>`), nothing before or after it.
 * Returns null for any other path.
 */
export function parsePlatePath(pathname: string): PlateTarget | null {
  const m = /^\/plate\/([^/?#]+)(?:\/([1-9]\d{0,1}))?\/?$/.exec(pathname);
  if (!m) return null;
  let rideId: string;
  try {
    rideId = decodeURIComponent(m[1]);
  } catch {
    return null;
  }
  if (rideId.length === 0 || rideId.length > MAX_ID || /[\s/\\\u0000-\u001f]/.test(rideId)) return null;
  const pivot = m[2] ? Number(m[2]) : null;
  if (pivot !== null && (pivot < 1 || pivot > MAX_PIVOT)) return null;
  return { rideId, joint: pivot === null ? null : pivot - 1 };
}

/**
 * A scanned or typed code, accepted only when it is a plate address of this app: the same scheme, host
 * and port as `appBase` (and under its path, when the app is served below one), then a plate path with no
 * query or fragment. A plate of another Pivotwatch server is told apart from a code that is no plate.
 */
export function parsePlateCode(code: string, appBase: string): PlateParse {
  const text = code.trim();
  if (!text) return { ok: false, why: 'empty' };
  let url: URL;
  let base: URL;
  try {
    url = new URL(text);
    base = new URL(trimBase(appBase) + '/');
  } catch {
    return { ok: false, why: 'not-plate' };
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') return { ok: false, why: 'not-plate' };
  if (url.username || url.password || url.search || url.hash) return { ok: false, why: 'not-plate' };
  const prefix = trimBase(base.pathname);
  const sameServer = url.origin === base.origin && url.pathname.startsWith(`${prefix}/`);
  const path = sameServer ? url.pathname.slice(prefix.length) : url.pathname.replace(/^.*(?=\/plate\/)/, '');
  const target = parsePlatePath(path);
  if (!target) return { ok: false, why: 'not-plate' };
  if (!sameServer) return { ok: false, why: 'other-server' };
  return { ok: true, target };
}
