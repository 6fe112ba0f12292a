/**
 * One rule for an email address, wherever it is written: in the job file (brief.email.from, to, cc — the
 * schema's `pattern`, which a test holds equal to ADDRESS_PATTERN) and on the command line (--to). An
 * address is `name@domain` or `Display Name <name@domain>`: no space, angle bracket or second @ in the
 * address itself, and no control character anywhere, so a CR/LF can never start a header of its own
 * (RFC 5322 §2.2: a header field ends at CRLF).
 */

/** The pattern of one address, as the JSON schema writes it. */
export const ADDRESS_PATTERN = '^(?:[^<>@\\s]+@[^<>@\\s]+|[^<>\\u0000-\\u001f\\u007f]*<[^<>@\\s]+@[^<>@\\s]+>)$';

const ADDRESS = new RegExp(ADDRESS_PATTERN, 'u');

export function isAddress(text: string): boolean {
  return ADDRESS.test(text);
}

/**
 * A comma-separated list as typed on the command line, cut at the commas outside double quotes
 * (RFC 5322 §3.4: `"Ops, North" <ops@x.example>` is one address). Entries lose the spaces around them; empty ones are dropped.
 * The entries are not checked here: see isAddress.
 */
export function splitAddressList(text: string): string[] {
  const out: string[] = [];
  let current = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted && c === '\\' && i + 1 < text.length) {
      current += c + text[++i];
      continue;
    }
    if (c === '"') quoted = !quoted;
    if (c === ',' && !quoted) {
      out.push(current);
      current = '';
    } else current += c;
  }
  out.push(current);
  // Only spaces and tabs are trimmed: a line break is never part of a list typed on one line.
  return out.map((s) => s.replace(/^[ \t]+|[ \t]+$/g, '')).filter((s) => s !== '');
}
