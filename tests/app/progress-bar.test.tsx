/**
 * The shared progress bar (components/progress-bar.tsx) as assistive technology reads it, against WAI-ARIA
 * 1.2's `progressbar` role: a determinate bar has aria-valuenow within aria-valuemin..aria-valuemax and a
 * name; aria-valuetext carries the read-out in words; an indeterminate bar (total unknown) has no
 * aria-valuenow ("If the progressbar is indeterminate, the author SHOULD omit the aria-valuenow attribute").
 * And the sync run's bars (features/sync/sync-progress-view.tsx) drawn from the engine's progress.
 */
import { render, screen } from '@testing-library/react-native';

import { ProgressBar, ofText, percentText } from '@/components/progress-bar';
import { DownloadProgressBar } from '@/features/api/download-progress-bar';
import { ImportProgress, csvDataRows } from '@/features/registry/import-progress';
import { SyncProgressView } from '@/features/sync/sync-progress-view';
import {
  type SyncProgress,
  onPhotos,
  onPush,
  runEnded,
  stepEnded,
  syncStarting,
} from '@/features/sync/sync-progress';

const bar = (name: string) => screen.getByRole('progressbar', { name });

test('a determinate bar: value, bounds, name and the read-out in words', () => {
  render(<ProgressBar label="Uploading photos" value={3} max={8} valueText={ofText(3, 8, 'photo')} />);
  const b = bar('Uploading photos');
  expect(b.props['aria-valuemin']).toBe(0);
  expect(b.props['aria-valuemax']).toBe(8);
  expect(b.props['aria-valuenow']).toBe(3);
  expect(b.props['aria-valuetext']).toBe('3 of 8 photos');
  expect(screen.getByText('3 of 8 photos')).toBeTruthy();
});

test('without words the read-out is the percentage, rounded down so 100 % means finished', () => {
  // 5 of 8 = 62.5 % (plain arithmetic); 199 of 200 = 99.5 %, which must not read as 100 %.
  expect(percentText(5, 8)).toBe('62 %');
  expect(percentText(199, 200)).toBe('99 %');
  expect(percentText(200, 200)).toBe('100 %');
  render(<ProgressBar label="Downloading the PDF" value={5} max={8} />);
  expect(bar('Downloading the PDF').props['aria-valuetext']).toBe('62 %');
  expect(screen.getByText('62 %')).toBeTruthy();
});

test('a value out of range is shown clamped, never past the end', () => {
  render(<ProgressBar label="Sending" value={12} max={10} />);
  expect(bar('Sending').props['aria-valuenow']).toBe(10);
});

test('an unknown total: indeterminate, with no aria-valuenow', () => {
  render(
    <ProgressBar label="Fetching the server’s update" value={0} max={null} valueText="asking the server" />,
  );
  const b = bar('Fetching the server’s update');
  expect(b.props['aria-valuenow']).toBeUndefined();
  expect(b.props['aria-valuemax']).toBeUndefined();
  expect(b.props['aria-valuetext']).toBe('asking the server');
});

test('"1 of 1 photo", "2 of 3 inspections": the unit follows the total', () => {
  expect(ofText(1, 1, 'photo')).toBe('1 of 1 photo');
  expect(ofText(2, 3, 'inspection')).toBe('2 of 3 inspections');
});

describe('the sync run', () => {
  const midway = (): SyncProgress => {
    let p = syncStarting();
    p = onPush(p, { records: { done: 0, total: 5 }, batches: { done: 0, total: 1 } });
    p = onPush(p, { records: { done: 5, total: 5 }, batches: { done: 1, total: 1 } });
    p = stepEnded(p, 'send', true);
    return onPhotos(p, {
      photos: { done: 1, total: 3 },
      bytes: { done: 1_500_000, total: 3_000_000 },
      current: { sha256: 'b', sentBytes: 500_000, totalBytes: 1_000_000 },
    });
  };

  test('while it runs: inspections, photos overall by bytes, and the photo going up', () => {
    render(<SyncProgressView progress={midway()} />);
    expect(bar('Sending inspections').props).toMatchObject({ 'aria-valuenow': 5, 'aria-valuemax': 5 });
    expect(bar('Uploading photos').props).toMatchObject({
      'aria-valuenow': 1_500_000,
      'aria-valuemax': 3_000_000,
      // lib/bytes.ts: SI prefixes, 1 MB = 10^6 B.
      'aria-valuetext': '1 of 3 photos · 1.50 MB of 3.00 MB',
    });
    expect(bar('Photo 2 of 3').props).toMatchObject({
      'aria-valuenow': 500_000,
      'aria-valuetext': '50 % of 1.00 MB',
    });
  });

  test('a stopped run keeps its bars where it stopped and says nothing is lost', () => {
    const stopped = runEnded(stepEnded(midway(), 'photos', false), false);
    render(<SyncProgressView progress={stopped} />);
    expect(bar('Uploading photos').props['aria-valuenow']).toBe(1_500_000);
    expect(screen.queryByRole('progressbar', { name: 'Photo 2 of 3' })).toBeNull();
    expect(screen.getByText(/The sync stopped here/)).toBeTruthy();
  });

  test('a finished run shows no bars', () => {
    render(<SyncProgressView progress={runEnded(midway(), true)} />);
    expect(screen.queryAllByRole('progressbar')).toHaveLength(0);
  });
});

describe('a file on its way (features/api/download-progress-bar.tsx)', () => {
  test('with its length known: bytes of the whole', () => {
    render(
      <DownloadProgressBar
        label="PDF of the notice"
        progress={{ step: 'downloading', receivedBytes: 40_000, totalBytes: 160_000 }}
      />,
    );
    expect(bar('PDF of the notice').props).toMatchObject({
      'aria-valuenow': 40_000,
      'aria-valuemax': 160_000,
      'aria-valuetext': '40.0 kB of 160 kB',
    });
  });

  test('without it: the three steps, still determinate', () => {
    const { rerender } = render(
      <DownloadProgressBar
        label="PDF"
        progress={{ step: 'preparing', receivedBytes: 0, totalBytes: null }}
      />,
    );
    expect(bar('PDF').props).toMatchObject({
      'aria-valuenow': 0,
      'aria-valuemax': 3,
      'aria-valuetext': 'The server is making the file (step 1 of 3)',
    });
    rerender(
      <DownloadProgressBar
        label="PDF"
        progress={{ step: 'downloading', receivedBytes: 5_000, totalBytes: null }}
      />,
    );
    expect(bar('PDF').props).toMatchObject({
      'aria-valuenow': 1,
      'aria-valuetext': 'Downloading, 5.00 kB so far (step 2 of 3)',
    });
  });
});

describe('a design file import (features/registry/import-progress.tsx)', () => {
  test('rows are counted as RFC 4180 lays a CSV out: a header line, then one record per line', () => {
    expect(csvDataRows('kind,name\r\npart,Arm\r\npart,Gondola\r\npivot,Main\r\n')).toBe(3);
    expect(csvDataRows('kind,name\n')).toBe(0);
    // A quoted cell may hold a line break (RFC 4180 §2.6): still one record.
    expect(csvDataRows('kind,name\npart,"Arm,\nleft"\n')).toBe(1);
  });

  test('checking: step 2 of 3, with the rows the server is checking', () => {
    render(<ImportProgress phase={{ step: 'checking', format: 'csv', rows: 48 }} />);
    expect(bar('Importing the design file').props).toMatchObject({
      'aria-valuenow': 1,
      'aria-valuemax': 3,
      'aria-valuetext': 'The server is parsing and checking 48 rows (step 2 of 3)',
    });
  });
});
