/** Dates as people read them here: 3 Mar 2025. Calendar dates (YYYY-MM-DD) are not shifted by time zone. */
export function formatDate(iso: string): string {
  const calendar = /^\d{4}-\d{2}-\d{2}$/.test(iso);
  const d = new Date(calendar ? `${iso}T12:00:00Z` : iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    ...(calendar ? { timeZone: 'UTC' } : {}),
  });
}

export function formatDateTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${formatDate(iso)}, ${d.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' })}`;
}
