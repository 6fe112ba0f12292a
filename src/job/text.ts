/**
 * Text in a job file must be text: no NUL or other control character but tab and line breaks. YAML lets a
 * double-quoted string write any of them ("\0", "\x07"), and they would be carried raw into the HTML (a
 * parse error there, HTML Standard §13.2.2), into SVG and PDF tags (not allowed in XML 1.0, §2.2) and into
 * file names. Each is reported at the value (or key) that holds it.
 *
 * The walk keeps its own stack, so a deeply nested file cannot overflow the call stack here.
 */
import { type JobPath, type Problem, pathText } from './schema.js';

// C0 controls except tab, line feed and carriage return (a title may hold a line break), and DEL.
// biome-ignore lint/suspicious/noControlCharactersInRegex: finding control characters is the point.
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/u;

export function controlCharacterProblems(data: unknown): Problem[] {
  const problems: Problem[] = [];
  const stack: [unknown, JobPath][] = [[data, []]];
  while (stack.length > 0) {
    const [value, path] = stack.pop() as [unknown, JobPath];
    if (typeof value === 'string') {
      const m = CONTROL.exec(value);
      if (m) problems.push(problem(path, 'value', m[0]));
    } else if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--) stack.push([value[i], [...path, i]]);
    } else if (value !== null && typeof value === 'object') {
      const entries = Object.entries(value);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [key, inner] = entries[i];
        const m = CONTROL.exec(key);
        if (m) problems.push(problem([...path, key], 'key', m[0]));
        else stack.push([inner, [...path, key]]);
      }
    }
  }
  return problems;
}

function problem(path: JobPath, at: 'value' | 'key', char: string): Problem {
  const code = `U+${char.codePointAt(0)?.toString(16).toUpperCase().padStart(4, '0')}`;
  const what = at === 'key' ? `the key ${JSON.stringify(String(path[path.length - 1]))}` : pathText(path);
  return {
    code: 'job-control-character',
    path,
    at,
    message: `${what} holds the control character ${code}, which is not text`,
    hint: 'remove it (a YAML escape such as "\\0" or "\\x07" writes one)',
  };
}
