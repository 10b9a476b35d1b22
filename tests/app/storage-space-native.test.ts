/**
 * An installed app's storage figures (features/device-db/storage-space.ts) from expo-file-system's
 * `Paths.availableDiskSpace` / `Paths.totalDiskSpace` (bytes, as its documentation states), stood in for
 * here: the phone's own numbers are not available under jest.
 */
import { readStorageSpace, requestPersistentStorage } from '@/features/device-db/storage-space';

const mockDisk = { total: 64_000_000_000, available: 150_000_000, fail: false };
jest.mock('expo-file-system', () => ({
  Paths: {
    get totalDiskSpace() {
      if (mockDisk.fail) throw new Error('not available');
      return mockDisk.total;
    },
    get availableDiskSpace() {
      return mockDisk.available;
    },
  },
}));

afterEach(() => {
  mockDisk.fail = false;
});

test("reads the phone's free and total space; the app's files are never cleared by the phone", async () => {
  expect(await readStorageSpace()).toEqual({
    usedBytes: null,
    availableBytes: 150_000_000,
    totalBytes: 64_000_000_000,
    persistence: 'device',
  });
  expect(await requestPersistentStorage()).toBe('device');
});

test('a platform that cannot say gives null, never an error', async () => {
  mockDisk.fail = true;
  expect(await readStorageSpace()).toBeNull();
});
