/**
 * The few functions of d3's modules that the scale tests use as reference implementations. The modules
 * come with vega (its dependencies, not ours) and ship no type declarations of their own.
 */
declare module 'd3-array' {
  export function ticks(start: number, stop: number, count: number): number[];
  export function tickIncrement(start: number, stop: number, count: number): number;
  export function tickStep(start: number, stop: number, count: number): number;
}

declare module 'd3-scale' {
  interface Linear {
    domain(d: number[]): Linear;
    domain(): number[];
    nice(count?: number): Linear;
  }
  interface Band {
    domain(d: string[]): Band;
    range(r: [number, number]): Band;
    paddingInner(p: number): Band;
    paddingOuter(p: number): Band;
    align(a: number): Band;
    bandwidth(): number;
    step(): number;
    (value: string): number | undefined;
  }
  export function scaleLinear(): Linear;
  export function scaleBand(): Band;
}

declare module 'd3-time' {
  interface Interval {
    every(step: number): Interval | null;
    range(start: Date, stop: Date): Date[];
  }
  export function utcTicks(start: Date, stop: Date, count: number): Date[];
  export const utcMonday: Interval;
}
