/**
 * One rule for an email address in the job file and on the command line (src/job/address.ts). The cases
 * of injection are those a shell hands over unchanged: a space between two addresses, a CR LF and a header
 * of its own (RFC 5322 §2.2: a header field ends at CRLF), a colon that would make a group (§3.4).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ADDRESS_PATTERN, isAddress, splitAddressList } from '../../src/job/address.js';
import { SCHEMA_PATH } from '../../src/job/schema.js';
import { addressList } from '../../src/render/email.js';

describe('one address rule', () => {
  it('is the pattern the job schema gives from, to and cc', () => {
    const schema = JSON.parse(readFileSync(SCHEMA_PATH, 'utf8'));
    const email = schema.properties.brief.properties.email.properties;
    expect(email.from.pattern).toBe(ADDRESS_PATTERN);
    expect(email.to.items.pattern).toBe(ADDRESS_PATTERN);
    expect(email.cc.items.pattern).toBe(ADDRESS_PATTERN);
  });

  it('takes an address and a display name with one', () => {
    expect(isAddress('ops@x.example')).toBe(true);
    expect(isAddress('Ops North <ops@x.example>')).toBe(true);
    expect(isAddress('"Ops, North" <ops@x.example>')).toBe(true);
  });

  it('refuses what would become another recipient or header', () => {
    for (const bad of [
      'a@x.example b@x.example',
      'a@x.example\r\nBcc: evil@y.example',
      'a@x.example:evil@y.example',
      'Ops\r\nBcc: evil@y.example <ops@x.example>',
      'Ops\u0000 <ops@x.example>',
      'a@x.example>',
      '',
    ])
      expect(isAddress(bad), JSON.stringify(bad)).toBe(false);
  });
});

describe('--to', () => {
  it('cuts a list at the commas outside quotes (RFC 5322 §3.4)', () => {
    expect(splitAddressList('a@x.example, "Ops, North" <ops@x.example> ,, ')).toEqual([
      'a@x.example',
      '"Ops, North" <ops@x.example>',
    ]);
    expect(splitAddressList('"say \\"hi\\", ok" <a@x.example>')).toEqual(['"say \\"hi\\", ok" <a@x.example>']);
  });

  it('refuses each injection as the job file does, naming the entry', () => {
    // nodemailer's parser once read 'a b' as one recipient with a display name, and a CR LF as a new line.
    expect(() => addressList('a@x.example b@x.example', '--to')).toThrow(
      /^--to has "a@x\.example b@x\.example", which is not an email address$/,
    );
    expect(() => addressList('a@x.example\r\nBcc: evil@y.example', '--to')).toThrow(/which is not an email address/);
    expect(() => addressList('a@x.example:evil@y.example', '--to')).toThrow(/which is not an email address/);
    expect(() => addressList('a@x.example, b@x.example\n', '--to')).toThrow(/which is not an email address/);
  });
});
