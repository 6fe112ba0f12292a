/** What every chart builder needs besides the series. */
export interface ChartOptions {
  /** BCP 47 locale for numbers, month names and labels ("en-GB", "de-DE"). */
  locale: string;
  /** The brief's accent colour (#rrggbb): the trend line's colour, as the job reference says. */
  accent?: string;
}
