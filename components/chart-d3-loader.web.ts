import { useEffect, useState } from 'react';

import type * as ChartD3Module from '@/components/chart-d3';

/** The scales and line paths the charts draw with (see chart-d3.ts). */
export type ChartD3 = typeof ChartD3Module;

let loaded: ChartD3 | null = null;
let pending: Promise<ChartD3> | null = null;

/**
 * The app's one `import()` of d3: its chunk is fetched when the first chart renders and kept for the
 * rest of the session. A failed fetch (offline before the service worker held the chunk) is tried again
 * by the next chart that renders.
 */
function loadChartD3(): Promise<ChartD3> {
  pending ??= import('@/components/chart-d3').then(
    (m) => (loaded = m),
    (err: unknown) => {
      pending = null;
      throw err;
    },
  );
  return pending;
}

/**
 * d3 once its chunk has loaded, else null: a chart keeps its measured, empty frame until then (the same
 * frame it shows before it knows its width), so nothing around it moves.
 */
export function useChartD3(): ChartD3 | null {
  const [d3, setD3] = useState(loaded);
  useEffect(() => {
    if (d3) return;
    let live = true;
    loadChartD3().then(
      (m) => {
        if (live) setD3(m);
      },
      () => {
        // The chart stays an empty frame with its summary read out; the next render tries again.
      },
    );
    return () => {
      live = false;
    };
  }, [d3]);
  return d3;
}
