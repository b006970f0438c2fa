// Is this error the database failing (rather than our code)? Then the answer is 503, "the
// workshop database is not answering; nothing was changed": a transaction that failed has rolled
// back, and the same request can be sent again.
//
// Counted as the database failing: no connection (refused, reset, timed out, unknown host, the
// pool giving up), the server shutting down or out of resources, and a transaction that lost a
// serialization or deadlock race. A constraint or data error is a bug of ours (500), not this.

const NETWORK_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EPIPE",
  "ENOTFOUND",
  "EAI_AGAIN",
  "EHOSTUNREACH",
  "ENETUNREACH",
  "ENETDOWN",
]);
// SQLSTATE classes: 08 connection exception, 53 insufficient resources, 57 operator intervention
// (shutdown, statement timeout), 58 system error; and the two retryable transaction failures.
const SQLSTATE_CLASSES = ["08", "53", "57", "58"];
const SQLSTATE_CODES = new Set(["40001", "40P01"]);
const MESSAGES =
  /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection ended unexpectedly|the database system is (starting up|shutting down|in recovery mode)/i;

export function isDatabaseFailure(e: unknown, depth = 0): boolean {
  if (!e || typeof e !== "object" || depth > 4) return false;
  const err = e as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  const code = typeof err.code === "string" ? err.code : "";
  if (NETWORK_CODES.has(code) || SQLSTATE_CODES.has(code)) return true;
  if (/^[0-9A-Z]{5}$/.test(code) && SQLSTATE_CLASSES.includes(code.slice(0, 2))) return true;
  if (typeof err.message === "string" && MESSAGES.test(err.message)) return true;
  if (Array.isArray(err.errors) && err.errors.some((x) => isDatabaseFailure(x, depth + 1))) return true;
  return isDatabaseFailure(err.cause, depth + 1);
}
