import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { sha256Hex } from '../../src/data/hash.js';

const sample = fileURLToPath(new URL('./files/hash-sample.csv', import.meta.url));

describe('sha256Hex — FIPS 180-4', () => {
  it('gives the published digest of "abc" (FIPS 180-4 / NIST example, SHA-256 "abc")', () => {
    expect(sha256Hex(new TextEncoder().encode('abc'))).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });

  it('gives the digest of a file as read by the bytes on disk', () => {
    // Expected value from GNU coreutils: `sha256sum test/data/files/hash-sample.csv`.
    expect(sha256Hex(readFileSync(sample))).toBe('ef61ecc7034f6355cae58b54e4902fb42120190fb3d3cf61b78714991c79f0bf');
  });
});
