import * as chartD3 from '@/components/chart-d3';

/** The scales and line paths the charts draw with (see chart-d3.ts). */
export type ChartD3 = typeof chartD3;

/** On a phone the bundle is on the device: d3 is there from the start (the web loads it on first use). */
export function useChartD3(): ChartD3 | null {
  return chartD3;
}
