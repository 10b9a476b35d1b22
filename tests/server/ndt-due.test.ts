/**
 * When a planned NDT falls due (features/pivot-life/ndt-due.ts). Expected dates are worked by hand with
 * the Gregorian calendar (2028 is a leap year: 29 February lies inside a year counted from mid-2027) and
 * checked with Python's datetime.date arithmetic; the 30-day "due" window is our own rule.
 */
import { earliestNdtDue, isNdtOverdue, ndtDue, NDT_DUE_WINDOW_DAYS } from '@/features/pivot-life/ndt-due';

const today = '2026-12-03';

describe('ndtDue', () => {
  it('is the last test of the method plus the interval; the latest test counts', () => {
    const [mt, ut] = ndtDue(
      [
        { method: 'MT', intervalDays: 365 },
        { method: 'UT', intervalDays: 730 },
      ],
      [
        { method: 'MT', testedOn: '2025-03-10', result: 'no_indications' },
        { method: 'MT', testedOn: '2026-03-15', result: 'acceptable_indications' },
        { method: 'UT', testedOn: '2025-06-01', result: 'no_indications' },
        // A test of another method never moves these dates.
        { method: 'VT', testedOn: '2026-11-30', result: 'no_indications' },
      ],
      today,
      '2020-01-01',
    );
    // 2026-03-15 + 365 d = 2027-03-15 (no 29 February between).
    expect(mt).toEqual({
      method: 'MT',
      intervalDays: 365,
      lastOn: '2026-03-15',
      lastResult: 'acceptable_indications',
      dueOn: '2027-03-15',
      state: 'upcoming',
    });
    // 2025-06-01 + 730 d = 2027-06-01 (2026 and 2027 are common years).
    expect(ut.dueOn).toBe('2027-06-01');
    expect(ut.state).toBe('upcoming');
  });

  it('crosses a leap day: 2027-06-01 + 365 d = 2028-05-31', () => {
    const [d] = ndtDue(
      [{ method: 'PT', intervalDays: 365 }],
      [{ method: 'PT', testedOn: '2027-06-01', result: 'no_indications' }],
      '2027-06-02',
      '2020-01-01',
    );
    expect(d.dueOn).toBe('2028-05-31');
  });

  it('is overdue the day after the due date, due within the window, upcoming beyond it', () => {
    const plan = [{ method: 'MT' as const, intervalDays: 100 }];
    const tested = (on: string) =>
      ndtDue(plan, [{ method: 'MT', testedOn: on, result: 'no_indications' }], today, '2020-01-01')[0];
    // 2026-08-24 + 100 d = 2026-12-02, the day before today: overdue.
    expect(tested('2026-08-24')).toMatchObject({ dueOn: '2026-12-02', state: 'overdue' });
    // 2026-08-25 + 100 d = 2026-12-03 = today: due, not yet overdue.
    expect(tested('2026-08-25')).toMatchObject({ dueOn: '2026-12-03', state: 'due' });
    // today + 30 d = 2027-01-02 is the window's last day; one more is upcoming.
    expect(NDT_DUE_WINDOW_DAYS).toBe(30);
    expect(tested('2026-09-24')).toMatchObject({ dueOn: '2027-01-02', state: 'due' });
    expect(tested('2026-09-25')).toMatchObject({ dueOn: '2027-01-03', state: 'upcoming' });
  });

  it('a method never tested is due from the day its plan took effect, and overdue once that is past', () => {
    const dues = ndtDue(
      [
        { method: 'MT', intervalDays: 365 },
        { method: 'ET', intervalDays: 180 },
      ],
      [],
      today,
      { byMethod: { MT: '2026-01-05' }, fallback: '2026-12-10' },
    );
    expect(dues[0]).toEqual({
      method: 'MT',
      intervalDays: 365,
      lastOn: null,
      lastResult: null,
      dueOn: '2026-01-05',
      state: 'never_tested',
    });
    expect(isNdtOverdue(dues[0], today)).toBe(true);
    expect(dues[1]).toMatchObject({ dueOn: '2026-12-10', state: 'never_tested' });
    expect(isNdtOverdue(dues[1], today)).toBe(false);
    expect(earliestNdtDue(dues)).toBe('2026-01-05');
    expect(earliestNdtDue([])).toBeNull();
  });
});
