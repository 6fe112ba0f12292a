/** What every chart builder needs besides the series. */
export interface ChartOptions {
  /** BCP 47 locale for numbers, month names and labels ("en-GB", "de-DE"). */
  locale: string;
  /** The brief's accent colour (#rrggbb): the trend line's colour, as the job reference says. */
  accent?: string;
}

/** NaN (undefined) becomes null in chart data: vega treats null as missing and breaks lines there. */
export function orNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}
