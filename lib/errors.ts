// The one shape of every refusal Benchtag answers, and the error a refusal is thrown as.
//
// Every non-2xx JSON answer of a route handler is an ErrorBody: `error` is a sentence in workshop
// words for the person (never a schema path or an internal field name), `issues` lists each
// problem with the place it belongs to (`path`, e.g. "lines.2.unitPriceMinor", for a form to put
// the message beside its field) and the problem in plain words (`message`). `issues` is empty when
// there is nothing more to say than `error`.

export interface FieldIssue {
  path: string;
  message: string;
}

export interface ErrorBody {
  error: string;
  issues: FieldIssue[];
}

export type RefusalStatus = 400 | 401 | 403 | 404 | 409 | 413 | 415 | 422 | 503;

/**
 * A refusal the user can act on: a clear reason and the HTTP status a route answers with.
 * Thrown by db/ functions and route handlers; the route wrapper turns it into an ErrorBody.
 */
export class Refusal extends Error {
  constructor(
    message: string,
    readonly status: RefusalStatus = 409,
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
    this.name = "Refusal";
  }
}

/** The answer when the database fails anywhere (including while reading who is signed in). */
export const DATABASE_NOT_ANSWERING = "The workshop database is not answering; nothing was changed. Try again in a moment.";
/** What a screen says when the server refused without a reason it could read (not our JSON, or none). */
export function noReasonGiven(status: number): string {
  if (status >= 500) return `The workshop server could not do this (error ${status}); nothing was changed. Try again in a moment.`;
  return `The workshop server refused this (error ${status}) without saying why. Reload the page and try again.`;
}

/** The answer to anything else unexpected. */
export const UNEXPECTED_FAILURE = "Something went wrong on our side; nothing was changed. Try again.";
/** The `error` of a request whose fields did not pass their checks. */
export const CHECK_THE_FIELDS = "Check the marked fields.";

export function errorBody(error: string, issues: FieldIssue[] = []): ErrorBody {
  return { error, issues };
}
