/**
 * The notice PDF draws each state it shows with that state's mark from the vocabulary (the mark the app
 * shows; tests/app/vocabulary-marks.test.tsx checks the two painters agree): the ride's operating status,
 * every finding's severity, and every reading's envelope status. The marks module is wrapped so each mark
 * the notice puts on paper is recorded, then the notice is rendered for real.
 */
import {
  envelopeStatusVocabulary,
  findingSeverityVocabulary,
  rideStatusVocabulary,
  type Mark,
} from '@/lib/vocabulary';
import { renderNoticePdf } from '@/server/notices/pdf';
import { fixtureNotice, loadFixturePhoto } from '@/scripts/sample-notice';

const drawn: { mark: Mark; word?: string }[] = [];

jest.mock('@/server/pdf/marks', () => {
  const actual = jest.requireActual<typeof import('@/server/pdf/marks')>('@/server/pdf/marks');
  return {
    ...actual,
    drawMarkIcon: (...args: Parameters<typeof actual.drawMarkIcon>) => {
      drawn.push({ mark: args[1] });
      return actual.drawMarkIcon(...args);
    },
    drawMarked: (...args: Parameters<typeof actual.drawMarked>) => {
      drawn.push({ mark: args[1], word: args[2] });
      return actual.drawMarked(...args);
    },
  };
});

jest.setTimeout(60_000);

beforeAll(async () => {
  const pdf = await renderNoticePdf(fixtureNotice, { pageSize: 'A4', loadPhoto: loadFixturePhoto });
  expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
});

const marksDrawn = () => drawn.map((d) => d.mark);

test('the fixture shows a status, findings and readings (so the checks below check something)', () => {
  expect(fixtureNotice.findings.length).toBeGreaterThan(0);
  expect(fixtureNotice.results.length).toBeGreaterThan(0);
});

test('the operating status is drawn with its vocabulary mark', () => {
  expect(marksDrawn()).toContainEqual(rideStatusVocabulary[fixtureNotice.operatingStatus.status].mark);
});

test('each finding is headed by its severity’s mark and words', () => {
  for (const f of fixtureNotice.findings) {
    const word = findingSeverityVocabulary[f.severity];
    expect(drawn).toContainEqual({ mark: word.mark, word: word.label });
  }
});

test('each reading’s status is drawn with its envelope mark', () => {
  for (const r of fixtureNotice.results)
    expect(marksDrawn()).toContainEqual(envelopeStatusVocabulary[r.status].mark);
});

test('every mark the notice draws is one of the vocabulary’s', () => {
  const known = [rideStatusVocabulary, findingSeverityVocabulary, envelopeStatusVocabulary].flatMap((t) =>
    Object.values<{ mark: Mark }>(t).map((w) => w.mark),
  );
  for (const mark of marksDrawn()) expect(known).toContainEqual(mark);
});
