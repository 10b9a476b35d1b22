/**
 * Finding-state and e-mail delivery marks: each state has its own shape and says its words (delivery
 * words from noticeDeliveryStateInfo), so colour is never the only signal, and each label stays readable
 * on its background.
 */
import { render, screen } from '@testing-library/react-native';

import { noticeDeliveryStateInfo, noticeDeliveryStates } from '@/features/notices/schema';
import { FindingStateMark, findingStateLook } from '@/features/notices/finding-state-mark';
import { NoticeDeliveryMark, deliveryLook } from '@/features/notices/notice-delivery-mark';
import { findingStates } from '@/features/review/schema';
import { contrast } from '@/tests/support/contrast';

test('the contrast formula gives the W3C’s extremes (black on white 21:1, equal colours 1:1)', () => {
  expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
  expect(contrast('#336699', '#336699')).toBeCloseTo(1, 10);
});

describe('finding states', () => {
  test('each state has a shape and words of its own', () => {
    expect(new Set(findingStates.map((s) => findingStateLook[s].shape)).size).toBe(findingStates.length);
    expect(new Set(findingStates.map((s) => findingStateLook[s].label)).size).toBe(findingStates.length);
  });

  test.each(findingStates)('%s: the label reaches 4.5:1 on its background (WCAG 2.1 AA)', (s) => {
    expect(contrast(findingStateLook[s].fg, findingStateLook[s].bg)).toBeGreaterThanOrEqual(4.5);
  });

  test.each(findingStates)('%s: the mark says its words', (s) => {
    render(<FindingStateMark state={s} />);
    expect(screen.getByText(findingStateLook[s].label)).toBeTruthy();
    expect(screen.getByLabelText(`State: ${findingStateLook[s].label}`)).toBeTruthy();
  });
});

describe('e-mail delivery', () => {
  test('each delivery state has a shape of its own', () => {
    const shapes = noticeDeliveryStates.map((s) => deliveryLook[s].shape);
    expect(new Set(shapes).size).toBe(noticeDeliveryStates.length);
  });

  test.each(noticeDeliveryStates)('%s: the label reaches 4.5:1 on its background (WCAG 2.1 AA)', (s) => {
    expect(contrast(deliveryLook[s].fg, deliveryLook[s].bg)).toBeGreaterThanOrEqual(4.5);
  });

  test.each(noticeDeliveryStates)('%s: the mark says the label of noticeDeliveryStateInfo', (s) => {
    render(<NoticeDeliveryMark state={s} />);
    const label = noticeDeliveryStateInfo[s].label;
    expect(screen.getByText(label)).toBeTruthy();
    expect(screen.getByLabelText(`E-mail: ${label}`)).toBeTruthy();
  });
});
