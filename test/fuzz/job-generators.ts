/**
 * fast-check generators for job files: YAML-ish token soup, and a valid job (its data file, logo and
 * templates folder exist beside it in the fuzz folder) with random values set at random keys, keys removed
 * or misspelt, written as YAML and then broken a little (a tab, a shifted line, a stray bracket, an anchor).
 */
import fc from 'fast-check';
import { stringify } from 'yaml';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

function baseJob(): { [key: string]: Json } {
  return {
    brief: {
      title: 'Fuzzed brief',
      organisation: 'Test bench',
      period: '2024-01',
      locale: 'en-GB',
      fiscal_year_start: 7,
      outputs: ['html', 'json'],
      accent: '#123456',
      logo: 'logo.png',
      templates: 'templates',
      email: { subject: 'Fuzz', from: 'a@b.example', to: ['c@d.example'] },
    },
    series: [
      {
        id: 'values',
        label: 'Values',
        unit: 'units',
        combine: 'sum',
        good: 'up',
        data: { file: 'data/values.csv', date: 'month', value: 'value', filter: { column: 'zone', equals: 'A' } },
        frequency: 'monthly',
        decomposition: { method: 'stl', model: 'auto', seasonal_window: 13, robust: true },
        firmness: { periods: 24 },
      },
    ],
    comparisons: [
      'year_on_year',
      { latest_year: { label: 'Last twelve months' } },
      { custom: { label: 'Winter', current: ['2024-01', '2024-02'], baseline: ['2023-01', '2023-02'] } },
    ],
    defaults: { combine: 'mean', decomposition: { period: 12 } },
  };
}

/** Paths a mutation may touch; the last part may also be a key that does not exist yet. */
const PATHS: (string | number)[][] = [
  ['brief'],
  ['brief', 'title'],
  ['brief', 'period'],
  ['brief', 'locale'],
  ['brief', 'fiscal_year_start'],
  ['brief', 'outputs'],
  ['brief', 'outputs', 0],
  ['brief', 'accent'],
  ['brief', 'logo'],
  ['brief', 'templates'],
  ['brief', 'page_size'],
  ['brief', 'pdf_archival'],
  ['brief', 'email'],
  ['brief', 'email', 'to'],
  ['brief', 'email', 'from'],
  ['series'],
  ['series', 0],
  ['series', 1],
  ['series', 0, 'id'],
  ['series', 0, 'combine'],
  ['series', 0, 'data'],
  ['series', 0, 'data', 'file'],
  ['series', 0, 'data', 'filter'],
  ['series', 0, 'data', 'filter', 'equals'],
  ['series', 0, 'data', 'delimiter'],
  ['series', 0, 'data', 'decimal'],
  ['series', 0, 'frequency'],
  ['series', 0, 'decomposition'],
  ['series', 0, 'decomposition', 'method'],
  ['series', 0, 'decomposition', 'periods'],
  ['series', 0, 'decomposition', 'period'],
  ['series', 0, 'decomposition', 'seasonal_window'],
  ['series', 0, 'decomposition', 'henderson'],
  ['series', 0, 'firmness', 'periods'],
  ['comparisons'],
  ['comparisons', 0],
  ['comparisons', 2, 'custom', 'current'],
  ['comparisons', 2, 'custom', 'current', 1],
  ['defaults'],
  ['defaults', 'decomposition', 'periods'],
  ['defaults', 'combine'],
];

const value: fc.Arbitrary<Json> = fc.oneof(
  fc.constantFrom<Json>(
    null,
    true,
    false,
    0,
    -1,
    7,
    12,
    13,
    1.5,
    1e300,
    '',
    ' ',
    'periodic',
    'mstl',
    'sum',
    'monthly',
    '2024-13',
    '2024-02-30',
    '2024-W53',
    '2024-Q5',
    '#zzzzzz',
    'xx-YY-invalid',
    '../outside/nothing.csv',
    'data',
    '/',
    '\u0000',
    '<script>alert(1)</script>',
    'מים 💧',
    [],
    {},
    [7, 365],
    [365, 7],
    ['2024-02', '2024-01'],
  ),
  fc.string({ maxLength: 12 }),
  fc.integer(),
  fc.double(),
  fc.array(fc.oneof(fc.string({ maxLength: 4 }), fc.integer()), { maxLength: 3 }),
  fc.dictionary(fc.constantFrom('label', 'column', 'equals', 'x', 'current'), fc.string({ maxLength: 5 }), {
    maxKeys: 2,
  }),
);

type Mutation = { op: 'set'; path: (string | number)[]; value: Json } | { op: 'delete'; path: (string | number)[] };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant('set' as const), path: fc.constantFrom(...PATHS), value }),
  fc.record({ op: fc.constant('delete' as const), path: fc.constantFrom(...PATHS) }),
  fc.record({
    op: fc.constant('set' as const),
    path: fc
      .tuple(fc.constantFrom(...PATHS), fc.constantFrom('titel', 'organization', 'seasonl_window', 'unknown', '0'))
      .map(([p, k]) => [...p.slice(0, -1), k]),
    value,
  }),
);

function apply(job: { [key: string]: Json }, m: Mutation): void {
  let node: Json = job;
  for (const part of m.path.slice(0, -1)) {
    if (node === null || typeof node !== 'object') return;
    node = (node as Record<string | number, Json>)[part as string];
  }
  if (node === null || typeof node !== 'object') return;
  const last = m.path[m.path.length - 1] as string;
  const holder = node as Record<string, Json>;
  if (m.op === 'delete') {
    if (Array.isArray(holder)) holder.splice(Number(last), 1);
    else delete holder[last];
  } else holder[last] = structuredClone(m.value);
}

/** A change to the YAML text that keeps most of it readable. */
const textBreak = fc.oneof(
  fc.record({
    kind: fc.constant('insert' as const),
    at: fc.nat(),
    text: fc.constantFrom(
      '\t',
      '  ',
      ':',
      ': ',
      '- ',
      '[',
      ']',
      '{',
      '}',
      '"',
      "'",
      '&a ',
      '*a',
      '!!binary ',
      '\n---\n',
      '? ',
      '|',
      '>',
      '#',
      '%YAML 1.1\n',
      '\u0000',
      '\uFEFF',
      '\r',
    ),
  }),
  fc.record({ kind: fc.constant('cut' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 15 }) }),
  fc.record({ kind: fc.constant('shift-line' as const), at: fc.nat(), by: fc.integer({ min: -3, max: 3 }) }),
);

type TextBreak = typeof textBreak extends fc.Arbitrary<infer B> ? B : never;

function breakText(text: string, b: TextBreak): string {
  if (text.length === 0) return text;
  if (b.kind === 'insert') {
    const at = b.at % (text.length + 1);
    return text.slice(0, at) + b.text + text.slice(at);
  }
  if (b.kind === 'cut') {
    const at = b.at % text.length;
    return text.slice(0, at) + text.slice(at + b.length);
  }
  const lines = text.split('\n');
  const i = b.at % lines.length;
  lines[i] = b.by >= 0 ? ' '.repeat(b.by) + lines[i] : lines[i].replace(new RegExp(`^ {0,${-b.by}}`), '');
  return lines.join('\n');
}

/** A valid job with up to three mutations, as YAML (block or flow style), with up to two text breaks. */
export const mutatedJob: fc.Arbitrary<string> = fc
  .record({
    mutations: fc.oneof(fc.constant([]), fc.array(mutation, { minLength: 1, maxLength: 3 })),
    flow: fc.boolean(),
    breaks: fc.oneof(fc.constant([]), fc.constant([]), fc.array(textBreak, { minLength: 1, maxLength: 2 })),
  })
  .map((r) => {
    const job = baseJob();
    for (const m of r.mutations) apply(job, m);
    let text = stringify(job, r.flow ? { collectionStyle: 'flow' } : {});
    for (const b of r.breaks) text = breakText(text, b);
    return text;
  });

/** Lines of YAML tokens in random order: not a job, but every construct the parser knows. */
export const jobText: fc.Arbitrary<string> = fc
  .array(
    fc.tuple(
      fc.integer({ min: 0, max: 6 }),
      fc.constantFrom(
        'brief:',
        'series:',
        'title: x',
        '- id: a',
        'data:',
        'file: data/values.csv',
        'comparisons:',
        '- latest_year',
        'defaults: {combine: sum}',
        '[1, 2',
        '{a: 1',
        '&anchor x',
        '*anchor',
        '*nowhere',
        '!!int x',
        '!custom y',
        '? complex',
        ': value',
        '|',
        '>-',
        '"unclosed',
        "'unclosed",
        'key: "\\q"',
        '---',
        '...',
        '%TAG ! x',
        '- - -',
        'a: b: c',
        '<<: *anchor',
        '#comment',
      ),
    ),
    { maxLength: 20 },
  )
  .map((lines) => lines.map(([indent, token]) => ' '.repeat(indent) + token).join('\n'));

/**
 * A valid job with one hostile change of the kinds that once crashed or stalled the loader: nesting far
 * deeper than a job needs (by brackets or by indentation), a text of up to a megabyte, a control
 * character in a text, or thousands of unknown keys. Written as YAML text directly, so the nesting is not
 * limited by a serialiser.
 */
export const hostileJob: fc.Arbitrary<string> = fc.oneof(
  fc.record({ depth: fc.integer({ min: 2, max: 3000 }), flow: fc.boolean() }).map(({ depth, flow }) => {
    const text = stringify(baseJob());
    if (flow) return `${text}defaults: ${'['.repeat(depth)}${']'.repeat(depth)}\n`;
    const block = Array.from({ length: depth }, (_, i) => `${'  '.repeat(i + 1)}k${i}:\n`).join('');
    return `${text}defaults:\n${block}${'  '.repeat(depth + 1)}v: 1\n`;
  }),
  fc
    .record({
      key: fc.constantFrom('title', 'organisation', 'author', 'contact'),
      size: fc.integer({ min: 900, max: 1_100_000 }),
      unit: fc.constantFrom('a', 'word ', 'מים ', '💧'),
    })
    .map(({ key, size, unit }) => {
      const job = baseJob();
      (job.brief as { [k: string]: Json })[key] =
        unit
          .repeat(Math.ceil(size / unit.length))
          .slice(0, size)
          .trim() || 'x';
      return stringify(job, { lineWidth: 0 });
    }),
  fc.record({ code: fc.integer({ min: 0, max: 0x1f }), at: fc.constantFrom('title', 'author') }).map(({ code, at }) => {
    const job = baseJob();
    (job.brief as { [k: string]: Json })[at] = `before${String.fromCharCode(code)}after`;
    return stringify(job);
  }),
  fc.integer({ min: 1, max: 5000 }).map((n) => {
    const keys = Array.from({ length: n }, (_, i) => `  unknown_${i}: ${i}\n`).join('');
    return stringify(baseJob()).replace('brief:\n', `brief:\n${keys}`);
  }),
);
