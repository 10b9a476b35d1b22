/**
 * The browser side of storage (features/device-db/storage-space.web.ts) against a stand-in for the
 * StorageManager of the WHATWG Storage Standard (`navigator.storage`: `estimate()` resolves
 * to `{ usage, quota }` in bytes; `persisted()` and `persist()` resolve to booleans), and the low-space
 * rule. The thresholds are our own choice (issue 15, item 8), not a standard's.
 */
import { LOW_SPACE_FLOOR_BYTES, isSpaceLow } from '@/features/device-db/storage-space-types';
import {
  forgetPersistenceRequest,
  readStorageSpace,
  requestPersistentStorage,
} from '@/features/device-db/storage-space.web';

const MB = 1_000_000;

type FakeStorage = {
  estimate?: jest.Mock;
  persisted?: jest.Mock;
  persist?: jest.Mock;
};

function installStorage(storage: FakeStorage | undefined) {
  Object.defineProperty(globalThis, 'navigator', {
    value: storage === undefined ? {} : { storage },
    configurable: true,
    writable: true,
  });
}

afterEach(() => {
  forgetPersistenceRequest();
  installStorage(undefined);
});

describe('readStorageSpace (web)', () => {
  test('reports the quota less the usage as available, and whether the data is kept', async () => {
    installStorage({
      estimate: jest.fn().mockResolvedValue({ usage: 12_500_000, quota: 2_000_000_000 }),
      persisted: jest.fn().mockResolvedValue(true),
    });
    expect(await readStorageSpace()).toEqual({
      usedBytes: 12_500_000,
      availableBytes: 1_987_500_000,
      totalBytes: 2_000_000_000,
      persistence: 'persisted',
    });
  });

  test('a browser that may clear the data says so; one without persisted() is unknown', async () => {
    installStorage({
      estimate: jest.fn().mockResolvedValue({ usage: 0, quota: 500 * MB }),
      persisted: jest.fn().mockResolvedValue(false),
    });
    expect((await readStorageSpace())?.persistence).toBe('best_effort');
    installStorage({ estimate: jest.fn().mockResolvedValue({ usage: 0, quota: 500 * MB }) });
    expect((await readStorageSpace())?.persistence).toBe('unknown');
  });

  test('no Storage API, a refusal, or a quota that is not a number give null, never an error', async () => {
    installStorage(undefined);
    expect(await readStorageSpace()).toBeNull();
    installStorage({ estimate: jest.fn().mockRejectedValue(new DOMException('denied', 'SecurityError')) });
    expect(await readStorageSpace()).toBeNull();
    installStorage({ estimate: jest.fn().mockResolvedValue({ usage: 10 }) });
    expect(await readStorageSpace()).toBeNull();
  });

  test('usage above the quota (the browser may overshoot) reads as nothing left, not a negative', async () => {
    installStorage({ estimate: jest.fn().mockResolvedValue({ usage: 120 * MB, quota: 100 * MB }) });
    expect(await readStorageSpace()).toMatchObject({ availableBytes: 0, usedBytes: 120 * MB });
  });
});

describe('requestPersistentStorage (web)', () => {
  test('asks once per page load when the data is not yet kept', async () => {
    const persist = jest.fn().mockResolvedValue(true);
    installStorage({ persisted: jest.fn().mockResolvedValue(false), persist });
    expect(await requestPersistentStorage()).toBe('persisted');
    expect(await requestPersistentStorage()).toBe('persisted');
    expect(persist).toHaveBeenCalledTimes(1);
  });

  test('does not ask when already kept, and reports a refusal as best effort', async () => {
    const persist = jest.fn().mockResolvedValue(false);
    installStorage({ persisted: jest.fn().mockResolvedValue(true), persist });
    expect(await requestPersistentStorage()).toBe('persisted');
    expect(persist).not.toHaveBeenCalled();
    forgetPersistenceRequest();
    installStorage({ persisted: jest.fn().mockResolvedValue(false), persist });
    expect(await requestPersistentStorage()).toBe('best_effort');
    expect(persist).toHaveBeenCalledTimes(1);
  });

  test('a browser without the API, or one that throws, leaves the app working', async () => {
    installStorage(undefined);
    expect(await requestPersistentStorage()).toBe('unknown');
    forgetPersistenceRequest();
    installStorage({
      persisted: jest.fn().mockResolvedValue(false),
      persist: jest.fn().mockRejectedValue(new Error('blocked')),
    });
    expect(await requestPersistentStorage()).toBe('best_effort');
  });
});

describe('isSpaceLow', () => {
  // Each case worked by hand from the rule: low under max(200 MB, min(10 % of total, 1 GB)).
  test.each([
    ['a small quota: 199 MB left of 500 MB', 199 * MB, 500 * MB, true],
    ['a small quota: 201 MB left of 500 MB', 201 * MB, 500 * MB, false],
    ['5 GB: 10 % is 500 MB, so 499 MB left is low', 499 * MB, 5000 * MB, true],
    ['5 GB: 501 MB left is not', 501 * MB, 5000 * MB, false],
    ['128 GB: the tenth is capped at 1 GB, so 999 MB left is low', 999 * MB, 128_000 * MB, true],
    ['128 GB: 1.2 GB left is not low although under 10 %', 1200 * MB, 128_000 * MB, false],
  ])('%s', (_words, availableBytes, totalBytes, low) => {
    expect(isSpaceLow({ availableBytes, totalBytes })).toBe(low);
  });

  test('the floor is 200 MB', () => {
    expect(LOW_SPACE_FLOOR_BYTES).toBe(200 * MB);
  });
});
