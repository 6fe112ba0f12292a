/**
 * An error in a job's query (SQL syntax, a missing table or column): the database's own message, to be
 * shown at the query in the job file. The data stage does not know where the job wrote the query; the
 * caller that does (brief/build.ts) moves the error there, using `offset`, the database's 1-based character
 * position in the query when it gives one.
 */
import { BriefError, type Place } from '../errors.js';

export class QueryError extends BriefError {
  readonly offset: number | null;
  constructor(code: string, message: string, hint: string, place: Place, offset: number | null) {
    super(code, message, hint, place);
    this.offset = offset;
  }
}
