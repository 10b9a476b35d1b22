/**
 * The demo's inspection photos: invented drawings of worn parts rendered to JPEG (assets/demo/, made by
 * scripts/render-demo-photos.ts). Demo inspections refer to them by SHA-256 like any phone's photos;
 * the seed stores their bytes the way an upload does.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

import type { Db } from '@/server/db';
import { repoRoot } from '@/server/paths';
import type { ObjectStorage } from '@/server/storage';
import { storePhoto } from '@/server/sync/photo-store';

export const demoPhotoFiles = [
  { name: 'tidebreaker-sub-arm-pin' },
  { name: 'tidebreaker-bushing-bore' },
  { name: 'skylark-dial-indicator' },
  { name: 'whirligig-restraint-latch' },
] as const;
export type DemoPhotoFile = (typeof demoPhotoFiles)[number];
export type DemoPhotoName = DemoPhotoFile['name'];

export const demoPhotosDir = path.join(repoRoot, 'assets', 'demo');

type DemoPhoto = { name: DemoPhotoName; bytes: Uint8Array; sha256: string };

const loaded = new Map<DemoPhotoName, DemoPhoto>();

/** A demo photo's bytes and SHA-256 (read once per process). */
export function demoPhoto(name: DemoPhotoName): DemoPhoto {
  let photo = loaded.get(name);
  if (!photo) {
    const bytes = new Uint8Array(fs.readFileSync(path.join(demoPhotosDir, `${name}.jpg`)));
    photo = { name, bytes, sha256: createHash('sha256').update(bytes).digest('hex') };
    loaded.set(name, photo);
  }
  return photo;
}

/**
 * Stores the bytes of every demo photo that a stored inspection refers to and the server does not have
 * yet, as if the phone had uploaded them. Returns how many it stored.
 */
export async function storeDemoPhotos(
  db: Db,
  storage: ObjectStorage,
  userId: string,
  now: Date,
): Promise<number> {
  let stored = 0;
  for (const { name } of demoPhotoFiles) {
    const photo = demoPhoto(name);
    const result = await storePhoto(
      db,
      storage,
      { sha256: photo.sha256, mime: 'image/jpeg', bytes: photo.bytes, userId },
      now,
    );
    if (result.stored) stored++;
  }
  return stored;
}
