/** Declarations of batch-process.js (plain JavaScript, run before anything is built or loaded). */
export declare const BATCH_FLAGS: string[];
export declare const VALUE_OPTIONS: Set<string>;
export declare const POOL_FROM: number;
export declare function jobArguments(args: string[]): string[];
export declare function isBatch(args: string[], env?: NodeJS.ProcessEnv, cores?: number): boolean;
export declare function runBatchProcess(args: string[]): Promise<number | null>;
