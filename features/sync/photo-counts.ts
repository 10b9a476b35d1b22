/**
 * How many photos are still to go up, counted the way the inspector counts them: one per photo attached
 * to a submitted inspection. The phone stores each photo's bytes once, by their SHA-256, so the same
 * picture attached twice (to two checklist items, or to an inspection and its correction) is one upload;
 * counting uploads would show fewer photos waiting than the inspector attached.
 */
export function photosWaitingCount(
  records: readonly { photos: readonly { sha256: string }[] }[],
  notUploaded: ReadonlySet<string>,
): number {
  let attached = 0;
  const referenced = new Set<string>();
  for (const r of records)
    for (const p of r.photos)
      if (notUploaded.has(p.sha256)) {
        attached++;
        referenced.add(p.sha256);
      }
  // A stored photo no record names any more still goes up (nothing is deleted on the phone): count it too.
  return attached + [...notUploaded].filter((sha) => !referenced.has(sha)).length;
}
