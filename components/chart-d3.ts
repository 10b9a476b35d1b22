/**
 * Every part of d3 the charts use, in one module. On the web it is reached only through the one `import()`
 * in chart-d3-loader.web.ts, so Metro gives d3 a chunk of its own that loads with the first chart drawn,
 * not with the screens (or the sign-in form) around it. Import d3 here, never in a chart.
 */
export { scaleLinear, scaleUtc } from 'd3-scale';
export { line } from 'd3-shape';
