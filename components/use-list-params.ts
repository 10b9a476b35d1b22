import { router, useLocalSearchParams } from 'expo-router';
import { useEffect, useMemo, useState } from 'react';
import type { z } from 'zod';

/**
 * A list's query (search, filters, sort, page) kept in the page's URL, so a reload, a shared link or
 * "back" from a ride returns to the same page of the same list. The URL is parsed with the API's own
 * query schema; anything it refuses falls back to the defaults.
 */
export function useListParams<S extends z.ZodType>(
  schema: S,
  keys: readonly string[],
): [z.output<S>, (patch: Record<string, string | number | readonly string[] | undefined>) => void] {
  const raw = useLocalSearchParams();
  // The router hands a new object on every render; the text of the picked values is what matters.
  const pickedText = JSON.stringify(
    Object.fromEntries(
      keys.flatMap((k) => {
        const v = raw[k];
        if (typeof v === 'string' && v !== '') return [[k, v]];
        if (Array.isArray(v) && v.length > 0) return [[k, v.join(',')]];
        return [];
      }),
    ),
  );
  const parsed = useMemo(() => {
    const result = schema.safeParse(JSON.parse(pickedText));
    return result.success ? result.data : schema.parse({});
  }, [schema, pickedText]);

  const set = (patch: Record<string, string | number | readonly string[] | undefined>) => {
    const next: Record<string, string | undefined> = {};
    for (const [k, v] of Object.entries(patch)) {
      if (v === undefined || v === '' || (Array.isArray(v) && v.length === 0)) next[k] = undefined;
      else next[k] = Array.isArray(v) ? v.join(',') : String(v);
    }
    router.setParams(next);
  };
  return [parsed, set];
}

const SEARCH_DELAY_MS = 300;

/**
 * A list's search box: the text is kept as typed, and reaches the URL (through `set`) once typing pauses.
 * `current` is the search the URL holds now.
 */
export function useSearchText(
  current: string | undefined,
  set: (q: string) => void,
): [string, (text: string) => void] {
  const [text, setText] = useState(current ?? '');
  useEffect(() => {
    if ((current ?? '') === text.trim()) return;
    const t = setTimeout(() => set(text.trim()), SEARCH_DELAY_MS);
    return () => clearTimeout(t);
  }, [text, current, set]);
  return [text, setText];
}
