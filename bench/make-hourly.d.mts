/** Types of bench/make-hourly.mjs, for the tests that import it. */
export function hourlyDemand(n: number, seed?: number): Float64Array;
export function writeHourlyJob(n: number, dir: string, seed?: number): string;
