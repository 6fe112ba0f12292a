/**
 * Where the Source Sans 3 TrueType files are: the charts' layout (font-metrics.ts), the PNG renderer and the
 * PDF all use these same files.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

export const FONT_NAME = 'Source Sans 3';
export type Face = 'Regular' | 'It' | 'Semibold' | 'Bold';
export const FACES: readonly Face[] = ['Regular', 'It', 'Semibold', 'Bold'];

let dir: string | undefined;

export function sourceSansFile(face: Face): string {
  if (dir === undefined) {
    const require = createRequire(import.meta.url);
    dir = join(dirname(require.resolve('source-sans/package.json')), 'TTF');
  }
  return join(dir, `SourceSans3-${face}.ttf`);
}

export function sourceSansFiles(): string[] {
  return FACES.map(sourceSansFile);
}
