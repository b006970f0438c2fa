// A refusal the user can act on: a clear reason and the HTTP status a route answers with.
// Thrown by db/ functions, turned into a 4xx JSON answer by the route handlers — never a 500.
export class Refusal extends Error {
  constructor(
    message: string,
    readonly status: 400 | 403 | 404 | 409 | 422 = 409,
    readonly issues: Array<{ path: string; message: string }> = [],
  ) {
    super(message);
    this.name = "Refusal";
  }
}
