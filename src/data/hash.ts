/**
 * SHA-256 (FIPS 180-4) of a file's bytes as lower-case hex, so a brief records exactly which data it was
 * built from.
 *
 *   sha256Hex(new TextEncoder().encode('abc'))
 *     → 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad' (FIPS 180-4 example)
 */
import { createHash } from 'node:crypto';

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}
