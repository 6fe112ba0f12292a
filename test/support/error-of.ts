/** The BriefError a call throws; any other error is rethrown, and no error at all fails the test. */
import { BriefError } from '../../src/errors.js';

export function errorOf(f: () => unknown): BriefError {
  try {
    f();
  } catch (e) {
    if (e instanceof BriefError) return e;
    throw e;
  }
  throw new Error('expected a BriefError');
}
