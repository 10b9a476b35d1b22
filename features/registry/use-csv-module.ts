import { useEffect, useState } from 'react';

import { loadCsvModule, type CsvModule } from '@/features/registry/csv-loader';

/**
 * The design file's reader, writer and the editor's model (features/registry/csv.ts), loaded on first use
 * (`loadCsvModule`: a chunk of its own on the web). `failed` when the chunk could not be fetched.
 */
export function useCsvModule(): { module: CsvModule | null; failed: boolean } {
  const [state, setState] = useState<{ module: CsvModule | null; failed: boolean }>({
    module: null,
    failed: false,
  });
  useEffect(() => {
    let live = true;
    loadCsvModule().then(
      (module) => live && setState({ module, failed: false }),
      () => live && setState({ module: null, failed: true }),
    );
    return () => {
      live = false;
    };
  }, []);
  return state;
}
