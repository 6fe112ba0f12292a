/**
 * The logo, embedded as a data URI so the brief stays one self-contained file. The type is read from the
 * file's first bytes (PNG and JPEG signatures, or an <svg> root), never from the name alone; anything else
 * is refused. An SVG is reduced to what draws (svg-safe.ts); a pipe or device is refused unread.
 */
import { BriefError } from '../errors.js';
import { NotRegularFile, readRegularFile } from '../read-file.js';
import { safeSvg } from './svg-safe.js';

export function readLogo(path: string, asWritten: string): { mime: string; dataUri: string } {
  let bytes: Buffer;
  try {
    bytes = readRegularFile(path);
  } catch (e) {
    if (e instanceof NotRegularFile) {
      throw new BriefError(
        'logo-not-file',
        `the logo file ${asWritten} is ${e.kind}, not an ordinary file`,
        'save the logo as an ordinary PNG, JPEG or SVG file',
        { file: asWritten },
      );
    }
    throw new BriefError(
      'logo-unreadable',
      `the logo file ${asWritten} cannot be read`,
      'check brief.logo: the path is relative to the job file',
      { file: asWritten },
    );
  }
  const mime = sniff(bytes);
  if (mime === null) {
    throw new BriefError(
      'logo-type',
      `the logo file ${asWritten} is not a PNG, JPEG or SVG image`,
      'convert it to PNG or SVG, or remove brief.logo',
      { file: asWritten },
    );
  }
  // An SVG keeps only what draws: no script, link or reference outside itself reaches any output.
  const safe = mime === 'image/svg+xml' ? Buffer.from(safeSvg(bytes.toString('utf8')), 'utf8') : bytes;
  return { mime, dataUri: `data:${mime};base64,${safe.toString('base64')}` };
}

export function sniff(bytes: Buffer): string | null {
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])))
    return 'image/png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  const head = bytes
    .subarray(0, 2048)
    .toString('utf8')
    .replace(/^\uFEFF/, '');
  if (/^\s*(<\?xml[^>]*>\s*)?(<!--[\s\S]*?-->\s*)*(<!DOCTYPE svg[^>[]*(\[[\s\S]*?\]\s*)?>\s*)?<svg[\s>]/i.test(head))
    return 'image/svg+xml';
  return null;
}
