/**
 * Output file names. A brief's files are named after its title (with the group, for a job split by a
 * column): lower case, accents dropped from Latin letters (São → sao; Київ keeps its ї), letters of every other script kept, every run of
 * anything else one dash. A stem longer than STEM_BYTES of UTF-8 is cut at a character and ends with eight
 * hex digits of the whole stem's SHA-256, so long titles give short, distinct names that are the same on
 * every run; file systems allow 255 bytes a name, and the temporary names of write.ts add about thirty.
 *
 *   fileStem('Online orders — North') → 'online-orders-north'
 *   fileStem('Ventas — São Paulo')    → 'ventas-sao-paulo'
 *   fileStem('Отчёт — Москва')        → 'отчёт-москва'
 */
import { createHash } from 'node:crypto';

export const STEM_BYTES = 120;

export function fileStem(title: string): string {
  const stem =
    title
      .normalize('NFKD')
      .replace(/(\p{Script=Latin})[\u0300-\u036f]+/gu, '$1')
      .normalize('NFC')
      .toLowerCase()
      .replace(/[^\p{L}\p{M}\p{N}]+/gu, '-')
      .replace(/^-+|-+$/g, '') || 'brief';
  if (Buffer.byteLength(stem) <= STEM_BYTES) return stem;
  const suffix = createHash('sha256').update(stem).digest('hex').slice(0, 8);
  let cut = '';
  for (const ch of stem) {
    if (Buffer.byteLength(cut + ch) > STEM_BYTES - suffix.length - 1) break;
    cut += ch;
  }
  return `${cut.replace(/-+$/, '')}-${suffix}`;
}

/** Two stems name the same file where names differ only in letter case (macOS, Windows shares). */
export function stemKey(stem: string): string {
  return stem.normalize('NFC').toLowerCase();
}
