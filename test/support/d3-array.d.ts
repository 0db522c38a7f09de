// d3-array (installed with the chart libraries) ships no types; the tests use one function of it as a reference.
declare module 'd3-array' {
  /** The p-quantile by linear interpolation between order statistics. */
  export function quantile(values: Iterable<number>, p: number): number | undefined;
}
