/**
 * Every file handed to a person goes through one module (features/api/save-or-share*.ts): the share
 * sheet on a phone, a download on the web.
 *
 * Phone: expo-sharing's JavaScript runs over its native module as jest-expo mocks it (`ExpoSharing`, whose
 * `shareAsync` is a jest.fn); expo-file-system's File is stood in for (no disk under jest), as in
 * storage-space-native.test.ts. Checked: `shareAsync(uri, { mimeType, UTI })` with the MIME types of
 * RFC 8118 (PDF), RFC 4180 (CSV) and RFC 8259 (JSON) and Apple's system-declared UTIs ("System-declared
 * uniform type identifiers": com.adobe.pdf, public.comma-separated-values-text, public.json; the UTIs from
 * memory of that list); the session token on the request; a phone without a share sheet keeps the file.
 *
 * Web: the web module loaded by its own name; `fetch`, the object URL and the link a download clicks are
 * stood in for. Checked: one `<a download>` click with the file's name and the fetched bytes.
 */
import ExpoSharing from 'expo-sharing/build/SharingNativeModule';

import { fileTypeOfName, fileTypes } from '@/features/api/file-types';
import { downloadPdf } from '@/features/api/pdf-download';
import { saveOrShareText } from '@/features/api/save-or-share';
import { OfflineError } from '@/lib/api-errors';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => ({ token: 'tok-123', user: { id: 'u1' } }) },
}));

type Written = { dir: string; name: string; text: string | null; downloadedFrom: string | null };
const mockFiles: Written[] = [];
const mockDownload = { fail: false, headers: {} as Record<string, string> };
jest.mock('expo-file-system', () => {
  class File {
    text: string | null = null;
    downloadedFrom: string | null = null;
    dir: string;
    name: string;
    constructor(dir: string, name: string) {
      this.dir = dir;
      this.name = name;
    }
    get uri() {
      return `file:///${this.dir}/${this.name}`;
    }
    get exists() {
      return false;
    }
    create() {
      mockFiles.push(this);
    }
    write(text: string) {
      this.text = text;
    }
    delete() {}
    static async downloadFileAsync(url: string, to: File, options: { headers: Record<string, string> }) {
      if (mockDownload.fail) throw new Error('The Internet connection appears to be offline.');
      mockDownload.headers = options.headers;
      to.downloadedFrom = url;
      mockFiles.push(to);
      return to;
    }
  }
  return { File, Paths: { cache: 'cache', document: 'documents' } };
});

const sharing = ExpoSharing as unknown as { shareAsync: jest.Mock; isAvailableAsync?: jest.Mock };

beforeEach(() => {
  mockFiles.length = 0;
  mockDownload.fail = false;
  sharing.shareAsync.mockReset();
  sharing.shareAsync.mockResolvedValue(undefined);
  delete sharing.isAvailableAsync;
});

describe('on a phone', () => {
  test('a report PDF is fetched with the session and opened in the share sheet as a PDF', async () => {
    const said = await downloadPdf('/api/inspections/i-1/report.pdf?size=A4', 'inspection-Kite-A4.pdf');
    expect(mockFiles).toHaveLength(1);
    expect(mockFiles[0]).toMatchObject({ dir: 'cache', name: 'inspection-Kite-A4.pdf' });
    expect(mockFiles[0].downloadedFrom).toMatch(/\/api\/inspections\/i-1\/report\.pdf\?size=A4$/);
    expect(mockDownload.headers).toMatchObject({
      Authorization: 'Bearer tok-123',
      Accept: 'application/pdf',
    });
    expect(sharing.shareAsync).toHaveBeenCalledTimes(1);
    expect(sharing.shareAsync).toHaveBeenCalledWith('file:///cache/inspection-Kite-A4.pdf', {
      mimeType: 'application/pdf',
      UTI: 'com.adobe.pdf',
      dialogTitle: 'inspection-Kite-A4.pdf',
    });
    expect(said).toBe('Opened inspection-Kite-A4.pdf in the share sheet');
  });

  test('an export made on the phone is written, then shared as CSV (or JSON)', async () => {
    await saveOrShareText('halvard-wheel-v3.csv', 'part,mass_kg\nhub,120\n', fileTypes.csv);
    expect(mockFiles[0]).toMatchObject({
      dir: 'cache',
      name: 'halvard-wheel-v3.csv',
      text: 'part,mass_kg\nhub,120\n',
    });
    expect(sharing.shareAsync).toHaveBeenCalledWith('file:///cache/halvard-wheel-v3.csv', {
      mimeType: 'text/csv',
      UTI: 'public.comma-separated-values-text',
      dialogTitle: 'halvard-wheel-v3.csv',
    });
    await saveOrShareText('halvard-wheel-v3.json', '{}', fileTypes.json);
    expect(sharing.shareAsync).toHaveBeenLastCalledWith('file:///cache/halvard-wheel-v3.json', {
      mimeType: 'application/json',
      UTI: 'public.json',
      dialogTitle: 'halvard-wheel-v3.json',
    });
  });

  test('a phone with no share sheet keeps the file in the app’s documents and says so', async () => {
    sharing.isAvailableAsync = jest.fn(async () => false);
    const said = await downloadPdf('/api/notices/n-1/pdf?size=LETTER', 'PW-2026-0001-Letter.pdf');
    expect(mockFiles[0]).toMatchObject({ dir: 'documents', name: 'PW-2026-0001-Letter.pdf' });
    expect(sharing.shareAsync).not.toHaveBeenCalled();
    expect(said).toBe('Saved PW-2026-0001-Letter.pdf to this device’s documents');
  });

  test('no connection: an OfflineError, and nothing is shared', async () => {
    mockDownload.fail = true;
    await expect(downloadPdf('/api/notices/n-1/pdf?size=A4', 'x.pdf')).rejects.toBeInstanceOf(OfflineError);
    expect(sharing.shareAsync).not.toHaveBeenCalled();
  });
});

test("a file's type from its name (attachments): extension, any case; anything else is plain bytes", () => {
  expect(fileTypeOfName('PW-2026-0001-A4.PDF')).toBe(fileTypes.pdf);
  expect(fileTypeOfName('rides.csv')).toBe(fileTypes.csv);
  expect(fileTypeOfName('design.json')).toBe(fileTypes.json);
  expect(fileTypeOfName('notes')).toEqual({ mimeType: 'application/octet-stream', uti: 'public.data' });
});

describe('on the web', () => {
  const web = jest.requireActual(
    '@/features/api/save-or-share.web',
  ) as typeof import('@/features/api/save-or-share.web');
  const clicks: { href: string; download: string }[] = [];
  const saved = Object.getOwnPropertyDescriptor(globalThis, 'document');
  let blobs: Blob[] = [];

  beforeEach(() => {
    clicks.length = 0;
    blobs = [];
    // The object URL is revoked 10 s after the click (save-blob.ts): not a wait worth having in a test.
    jest.useFakeTimers();
    const doc = {
      createElement: () => {
        const a = {
          href: '',
          download: '',
          rel: '',
          click: () => clicks.push({ href: a.href, download: a.download }),
          remove: () => undefined,
        };
        return a;
      },
      body: { appendChild: () => undefined },
    };
    Object.defineProperty(globalThis, 'document', { value: doc, configurable: true, writable: true });
    jest.spyOn(URL, 'createObjectURL').mockImplementation((b) => {
      blobs.push(b as Blob);
      return `blob:pivotwatch/${blobs.length}`;
    });
    jest.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
  });
  afterEach(() => {
    jest.runOnlyPendingTimers();
    jest.useRealTimers();
    jest.restoreAllMocks();
    if (saved) Object.defineProperty(globalThis, 'document', saved);
    else delete (globalThis as Record<string, unknown>).document;
  });

  test('a PDF from the API is fetched with the session and downloaded under its name', async () => {
    const pdf = new Blob(['%PDF-1.7 …'], { type: 'application/pdf' });
    const fetchSpy = jest
      .spyOn(globalThis, 'fetch')
      .mockResolvedValue({ ok: true, status: 200, blob: async () => pdf } as unknown as Response);
    const said = await web.saveOrShareApiFile(
      '/api/notices/n-1/pdf?size=A4',
      'PW-2026-0001-A4.pdf',
      fileTypes.pdf,
    );
    const [url, init] = fetchSpy.mock.calls[0] as [string, RequestInit];
    expect(url).toMatch(/\/api\/notices\/n-1\/pdf\?size=A4$/);
    expect(init.headers).toMatchObject({ Authorization: 'Bearer tok-123', Accept: 'application/pdf' });
    expect(clicks).toEqual([{ href: 'blob:pivotwatch/1', download: 'PW-2026-0001-A4.pdf' }]);
    expect(blobs[0]).toBe(pdf);
    expect(said).toBe('Downloaded PW-2026-0001-A4.pdf');
    expect(sharing.shareAsync).not.toHaveBeenCalled();
  });

  test('an export is downloaded from the page itself, typed as CSV', async () => {
    await web.saveOrShareText('rides.csv', 'name\nLittle Kite\n', fileTypes.csv);
    expect(clicks).toEqual([{ href: 'blob:pivotwatch/1', download: 'rides.csv' }]);
    expect(blobs[0].type).toBe('text/csv');
    expect(await blobs[0].text()).toBe('name\nLittle Kite\n');
  });
});
