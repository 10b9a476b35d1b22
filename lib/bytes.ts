/**
 * A byte count with SI prefixes (1 kB = 1000 B, 1 MB = 1000 kB, as SI and IEC 80000-13 define them), to
 * three significant figures at most: "912 B", "84.3 kB", "1.25 MB".
 */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '—';
  if (bytes < 1000) return `${Math.round(bytes)} B`;
  const units = ['kB', 'MB', 'GB'];
  let value = bytes / 1000;
  let unit = 0;
  while (value >= 999.5 && unit < units.length - 1) {
    value /= 1000;
    unit += 1;
  }
  const digits = value < 9.995 ? 2 : value < 99.95 ? 1 : 0;
  return `${value.toFixed(digits)} ${units[unit]}`;
}
