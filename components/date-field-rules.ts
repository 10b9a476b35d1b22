import { formatDate, isRealIsoDay } from '@/lib/dates';

/**
 * What every date field takes, on the web and on a phone. The value is a calendar date as YYYY-MM-DD (the
 * forms' and the API's shape) or null for none; `min` and `max` are calendar dates too.
 */
export type DateFieldProps = {
  label: string;
  value: string | null | undefined;
  onChange: (value: string | null) => void;
  onBlur?: () => void;
  error?: string;
  hint?: string;
  min?: string;
  max?: string;
  /** Whether the date may be removed (a filter, an optional date); true unless said otherwise. */
  clearable?: boolean;
};

/**
 * Why a date picked or typed cannot be taken (outside `min`..`max`, or not a real day), in the one date
 * format; null when it is fine or empty. Out-of-range dates are refused here, so nothing is changed.
 */
export function dateRangeProblem(value: string, min?: string, max?: string): string | null {
  if (value === '') return null;
  if (!isRealIsoDay(value)) return 'Must be a real date';
  if (min && value < min) return `Must be on or after ${formatDate(min)}`;
  if (max && value > max) return `Must be on or before ${formatDate(max)}`;
  return null;
}

/** A calendar date as a Date at noon on the device's clock (noon never meets a daylight-saving change). */
export function dateOfDay(day: string): Date {
  const [y, m, d] = day.split('-').map(Number);
  return new Date(y, m - 1, d, 12);
}
