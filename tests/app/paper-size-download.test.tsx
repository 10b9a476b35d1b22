/**
 * The A4 / US Letter download of a server-made PDF (features/api/paper-download.tsx), which the plates
 * sheet and the inspector's report share: the size pressed is the size fetched, both buttons wait while one
 * is under way, and the outcome is said — where the file went, or why it could not be fetched (the offline
 * words of the caller, else the server's message).
 */
import { act, fireEvent, render, screen } from '@testing-library/react-native';

import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { PaperSizeDownload } from '@/features/api/paper-download';
import type { PaperSize } from '@/features/api/pdf-download';

function renderDownload(fetch: (size: PaperSize) => Promise<string>) {
  render(
    <PaperSizeDownload
      label="My report"
      what="the inspection report of Harbour Swing"
      progressLabel="Inspection report of Harbour Swing"
      failure="The report could not be fetched."
      offline="No connection: download it when you have signal."
      fetch={(size) => fetch(size)}
    />,
  );
}

test('A4 and Letter fetch their own size; the place it went is said', async () => {
  const asked: PaperSize[] = [];
  renderDownload(async (size) => {
    asked.push(size);
    return `Saved as report-${size}.pdf`;
  });
  await act(async () => fireEvent.press(screen.getByRole('button', { name: /^My report · A4:/ })));
  expect(await screen.findByText('Saved as report-A4.pdf')).toBeTruthy();
  await act(async () => fireEvent.press(screen.getByRole('button', { name: /^Letter:.*US Letter paper$/ })));
  expect(await screen.findByText('Saved as report-LETTER.pdf')).toBeTruthy();
  expect(asked).toEqual(['A4', 'LETTER']);
});

test('while one size downloads, neither button starts another', async () => {
  let finish!: (text: string) => void;
  const asked: PaperSize[] = [];
  renderDownload(
    (size) =>
      new Promise<string>((resolve) => {
        asked.push(size);
        finish = resolve;
      }),
  );
  await act(async () => fireEvent.press(screen.getByRole('button', { name: /^My report · A4:/ })));
  await act(async () => fireEvent.press(screen.getByRole('button', { name: /^Letter:/ })));
  expect(asked).toEqual(['A4']);
  await act(async () => finish('Saved'));
  expect(await screen.findByText('Saved')).toBeTruthy();
});

test('offline, the caller’s words; refused, the server’s message', async () => {
  let fail: Error = new OfflineError(new TypeError('Failed to fetch'));
  renderDownload(async () => {
    throw fail;
  });
  await act(async () => fireEvent.press(screen.getByRole('button', { name: /^My report · A4:/ })));
  expect(
    await screen.findByText(
      'The report could not be fetched. No connection: download it when you have signal.',
    ),
  ).toBeTruthy();
  fail = new ApiRequestError(404, 'not_found', 'No such inspection.');
  await act(async () => fireEvent.press(screen.getByRole('button', { name: /^Letter:/ })));
  expect(await screen.findByText('The report could not be fetched. No such inspection.')).toBeTruthy();
});
