import { isPeriodText } from '../job/validate.js';
import { usage } from './args.js';

/** --period of render and check, checked as brief.period is (a form a job may write, a date in the calendar). */
export function periodOption(command: string, text: string): string {
  if (!isPeriodText(text)) {
    throw usage(
      command,
      `--period must be a reporting period, got "${text}"`,
      'write it as 2026-09 (month), 2026-Q3, 2026-W39, 2026-09-15 (day) or 2026-09-15T14:00 (hour)',
    );
  }
  return text;
}
