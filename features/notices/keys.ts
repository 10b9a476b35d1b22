/** Query keys of notices; every query and mutation of the feature keys through these. */
export const noticeKeys = {
  all: ['notices'] as const,
  lists: () => [...noticeKeys.all, 'list'] as const,
  /** One page of the list, keyed by its cleaned query. */
  list: (query: Record<string, unknown>) => [...noticeKeys.lists(), query] as const,
  details: () => [...noticeKeys.all, 'detail'] as const,
  detail: (id: string) => [...noticeKeys.details(), id] as const,
};
