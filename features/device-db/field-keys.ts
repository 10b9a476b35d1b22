/** Query keys of what the app reads from the phone's own database (rides, drafts, photos, sent records). */
export const fieldKeys = {
  all: ['field'] as const,
  rides: () => [...fieldKeys.all, 'rides'] as const,
  ride: (id: string) => [...fieldKeys.all, 'ride', id] as const,
  draft: (id: string) => [...fieldKeys.all, 'draft', id] as const,
  photo: (sha: string) => [...fieldKeys.all, 'photo', sha] as const,
  /** Sent inspections with the supervisors' decisions on them. */
  sent: () => [...fieldKeys.all, 'sent'] as const,
  /** What the phone's database holds, and the storage room the platform reports. */
  holdings: () => [...fieldKeys.all, 'holdings'] as const,
  space: () => [...fieldKeys.all, 'space'] as const,
};
